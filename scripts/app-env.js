// What every app process (`npm start`, `npm run start:cluster`, the benchmark's server) is started
// with on top of the caller's environment.
//
// MALLOC_ARENA_MAX: glibc gives each thread that allocates (the print and odds workers, libuv's
// pool) a malloc arena of its own, and memory freed in an arena is rarely handed back; two arenas
// keep an idle server a hundred-odd MB smaller, at no measurable cost to build times.
export function appEnv(env = process.env) {
	return { ...env, MALLOC_ARENA_MAX: env.MALLOC_ARENA_MAX ?? '2' };
}
