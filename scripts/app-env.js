// What every app process (`npm start`, `npm run start:cluster`, the benchmark's server) is started
// with on top of the caller's environment.
//
// MALLOC_ARENA_MAX: glibc gives each thread that allocates (the print and odds workers, libuv's
// pool) a malloc arena of its own, and memory freed in an arena is rarely handed back; two arenas
// keep an idle server a hundred-odd MB smaller, at no measurable cost to build times.
//
// --max-old-space-size: V8 sizes a heap's growth by the room it may take; on a 64-bit host with
// no limit it lets a heap run to about four times what it still uses before collecting, and
// every page of that stays resident. A stated limit makes it collect sooner (the server's own
// heap uses ~100 MB after a busy spell). Options of the caller's own come after, so theirs win.
export const HEAP_LIMIT_MB = 512;

export function appEnv(env = process.env) {
	return {
		...env,
		MALLOC_ARENA_MAX: env.MALLOC_ARENA_MAX ?? '2',
		NODE_OPTIONS: [`--max-old-space-size=${HEAP_LIMIT_MB}`, env.NODE_OPTIONS].filter(Boolean).join(' ')
	};
}
