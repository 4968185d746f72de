/**
 * A worker thread's scheduling priority. On a machine with few cores the server's own thread
 * must win the CPU over long computations, or requests wait behind them. Linux keeps a nice value
 * per thread: the thread's own id is the last part of /proc/thread-self (`<pid>/task/<tid>`).
 * Elsewhere, or when the system refuses, the thread keeps its priority.
 */
import { readlinkSync } from 'node:fs';
import { setPriority } from 'node:os';

/** The nice value worker threads run at (0 normal, 19 lowest). */
export const WORKER_NICE = 10;

/** Lowers the calling thread's priority; true when it was lowered. */
export function lowerThreadPriority(nice = WORKER_NICE): boolean {
	try {
		const tid = Number(readlinkSync('/proc/thread-self').split('/').at(-1));
		if (!Number.isInteger(tid) || tid <= 0) return false;
		setPriority(tid, nice);
		return true;
	} catch {
		return false;
	}
}
