/**
 * A worker thread's scheduling priority. On a machine with few cores the server's own thread
 * must win the CPU over long computations, or requests wait behind them. Linux schedules each
 * thread on its own: the thread's id is the last part of /proc/thread-self (`<pid>/task/<tid>`).
 *
 * A lower nice value alone still lets a worker hold a core for a moment after the server's thread
 * wakes up on it. Linux's idle policy (SCHED_IDLE, sched(7)) gives a core up at once to any
 * ordinary thread that wants it, and a thread waking up takes a core running only idle-policy
 * threads as a free one. Node has no call for it, so util-linux's `chrt` sets it; any thread may
 * lower itself to it. The policy can starve workers on a machine kept busy by other programs:
 * `PADDOCK_WORKER_PRIORITY=low` keeps them at the nice value only.
 *
 * Elsewhere, or when the system refuses, the thread keeps its priority.
 */
import { execFileSync } from 'node:child_process';
import { readlinkSync } from 'node:fs';
import { setPriority } from 'node:os';

/** The nice value worker threads run at (0 normal, 19 lowest). */
export const WORKER_NICE = 10;

export type WorkerPriority = 'idle' | 'low';

/** `PADDOCK_WORKER_PRIORITY`: `low` (a nice value) or, by default, `idle` (the idle policy as well). */
export function workerPriority(value: string | undefined): WorkerPriority {
	return value?.trim().toLowerCase() === 'low' ? 'low' : 'idle';
}

/** What the calling thread was lowered to: its nice value, and whether it runs under the idle policy. */
export function lowerThreadPriority(priority = workerPriority(process.env.PADDOCK_WORKER_PRIORITY), nice = WORKER_NICE): { nice: boolean; idle: boolean } {
	let tid: number;
	try {
		tid = Number(readlinkSync('/proc/thread-self').split('/').at(-1));
	} catch {
		return { nice: false, idle: false };
	}
	if (!Number.isInteger(tid) || tid <= 0) return { nice: false, idle: false };
	let niced = false;
	try {
		setPriority(tid, nice);
		niced = true;
	} catch {
		// not ours to lower
	}
	if (priority !== 'idle') return { nice: niced, idle: false };
	try {
		execFileSync('chrt', ['--idle', '--pid', '0', String(tid)], { stdio: 'ignore', timeout: 5_000 });
		return { nice: niced, idle: true };
	} catch {
		return { nice: niced, idle: false };
	}
}
