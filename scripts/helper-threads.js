// The built server's first module (scripts/server-entry.js puts it first in build/index.js).
//
// Before any of the app's code runs, Node has started V8's helper threads. They compile hot code
// and collect garbage for every thread of the process, so while print workers build sheets they
// do much of the workers' work: in three bursts of eight builds they took some 2.2 s of CPU, four
// times the server thread's own 0.55 s. The print workers run at a lower priority
// (src/lib/threads/priority.ts) but their helpers did not, and on a machine with few cores they
// took the CPU from the server's thread while it had requests to answer. Lowered here to the
// workers' level. The server's thread keeps its own priority, and so do libuv's file and
// cryptography threads (they serve the server's own requests) and every thread started later.
//
// Linux keeps a nice value per thread (the ids under /proc/self/task, proc(5)); a thread's id is
// handed out in the order threads start. Node starts, before any script: its debug-signal thread,
// V8's delayed-task thread and V8's helper threads (--v8-pool-size, 4 unless set); then libuv's
// threads, when the first module file is read. Elsewhere, or when the system refuses, nothing
// changes.
import { readdirSync, readFileSync } from 'node:fs';
import { setPriority } from 'node:os';

/** The nice value helper threads run at: the print workers' (WORKER_NICE in src/lib/threads/priority.ts). */
const HELPER_NICE = 10;
/** Node's own threads started before V8's helpers: its debug-signal thread and V8's delayed-task thread. */
const BEFORE_HELPERS = 2;
const DEFAULT_V8_POOL = 4;

/** V8's helper-thread count: --v8-pool-size on the command line or in NODE_OPTIONS, else Node's default. */
function v8PoolSize(execArgv = process.execArgv, nodeOptions = process.env.NODE_OPTIONS ?? '') {
	const set = [...`${execArgv.join(' ')} ${nodeOptions}`.matchAll(/--v8-pool-size[= ](\d+)/g)];
	// Node takes 0 to mean "as many as there are cores"; then the helpers are not told apart here.
	const size = set.length ? Number(set.at(-1)[1]) : DEFAULT_V8_POOL;
	return size > 0 ? size : null;
}

/** The process's threads in the order they started (ids wrap round at pid_max). */
export function threadsInStartOrder(pid = process.pid) {
	const max = Number(readFileSync('/proc/sys/kernel/pid_max', 'utf8'));
	const age = (tid) => (tid - pid + max) % max;
	return readdirSync(`/proc/${pid}/task`)
		.map(Number)
		.sort((a, b) => age(a) - age(b));
}

/** Lowers Node's startup threads (not the main one). */
function lowerHelperThreads() {
	const pool = v8PoolSize();
	if (pool === null) return;
	let threads;
	try {
		threads = threadsInStartOrder();
	} catch {
		return;
	}
	for (const tid of threads.slice(1, 1 + BEFORE_HELPERS + pool)) {
		try {
			setPriority(tid, HELPER_NICE);
		} catch {
			// not ours to lower
		}
	}
}

lowerHelperThreads();
