// What every app process (`npm start`, `npm run start:cluster`, the benchmark's server) is started
// with on top of the caller's environment; a value the caller set is kept.
//
// MALLOC_ARENA_MAX: glibc gives each thread that allocates (the print and odds workers, libuv's
// pool) a malloc arena of its own, and memory freed in an arena is rarely handed back; two arenas
// keep an idle server a hundred-odd MB smaller, at no measurable cost to build times.
//
// MALLOC_MMAP_THRESHOLD_ / MALLOC_TRIM_THRESHOLD_: left alone, glibc raises its mmap threshold
// each time a large block is freed, up to 32 MB, after which build outputs and request bodies
// come from the heap and the holes they leave stay resident. Fixed at glibc's own starting value
// (128 KB), a large block is mapped on its own and given back when freed: ~35 MB less at idle
// and after a soak.
//
// --max-old-space-size: V8 sizes a heap's growth by the room it may take; on a 64-bit host with
// no limit it lets a heap run to about four times what it still uses before collecting, and
// every page of that stays resident. A stated limit makes it collect sooner (the server's own
// heap uses ~100 MB after a busy spell). Options of the caller's own come after, so theirs win.
//
// UV_THREADPOOL_SIZE: libuv's four threads serve file reads and writes and the session cookie's
// cryptography alike. While builds read art and write files, a signed-in request's decryption
// would wait in that queue; more threads keep it short (they sleep when there is nothing to do).
export const HEAP_LIMIT_MB = 512;
export const THREADPOOL_SIZE = 16;
const LARGE_BLOCK_BYTES = String(128 * 1024);

export function appEnv(env = process.env) {
	return {
		...env,
		MALLOC_ARENA_MAX: env.MALLOC_ARENA_MAX ?? '2',
		UV_THREADPOOL_SIZE: env.UV_THREADPOOL_SIZE ?? String(THREADPOOL_SIZE),
		MALLOC_MMAP_THRESHOLD_: env.MALLOC_MMAP_THRESHOLD_ ?? LARGE_BLOCK_BYTES,
		MALLOC_TRIM_THRESHOLD_: env.MALLOC_TRIM_THRESHOLD_ ?? LARGE_BLOCK_BYTES,
		NODE_OPTIONS: [`--max-old-space-size=${HEAP_LIMIT_MB}`, env.NODE_OPTIONS].filter(Boolean).join(' ')
	};
}
