/**
 * What app processes are started with (scripts/app-env.js): the memory settings are set unless
 * the caller set their own, and the heap limit is the one V8 itself then reports.
 */
import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { appEnv, HEAP_LIMIT_MB } from '../../scripts/app-env.js';

/** The heap limit V8 reports in a node process started with `env`, in MB (v8.getHeapStatistics). */
function heapLimitMb(env: NodeJS.ProcessEnv): number {
	const out = execFileSync(process.execPath, ['-e', 'console.log(require("node:v8").getHeapStatistics().heap_size_limit)'], { env, encoding: 'utf8' });
	return Number(out.trim()) / 2 ** 20;
}

describe('app process environment', () => {
	it('sets the malloc and heap settings when the caller has none', () => {
		const env = appEnv({ PATH: process.env.PATH });
		expect(env.MALLOC_ARENA_MAX).toBe('2');
		expect(env.MALLOC_MMAP_THRESHOLD_).toBe('131072');
		expect(env.MALLOC_TRIM_THRESHOLD_).toBe('131072');
		expect(env.NODE_OPTIONS).toBe(`--max-old-space-size=${HEAP_LIMIT_MB}`);
	});

	it("keeps the caller's own values", () => {
		const env = appEnv({ PATH: process.env.PATH, MALLOC_ARENA_MAX: '4', MALLOC_MMAP_THRESHOLD_: '1048576', NODE_OPTIONS: '--max-old-space-size=300' });
		expect(env.MALLOC_ARENA_MAX).toBe('4');
		expect(env.MALLOC_MMAP_THRESHOLD_).toBe('1048576');
		expect(env.NODE_OPTIONS).toBe(`--max-old-space-size=${HEAP_LIMIT_MB} --max-old-space-size=300`);
	});

	it('gives the process the heap limit, and the caller’s own wins (V8 takes the last flag)', () => {
		// heap_size_limit is the old generation plus the young one: a little above the flag's figure.
		const ours = heapLimitMb(appEnv({ PATH: process.env.PATH }));
		expect(ours).toBeGreaterThanOrEqual(HEAP_LIMIT_MB);
		expect(ours).toBeLessThan(HEAP_LIMIT_MB + 128);
		const theirs = heapLimitMb(appEnv({ PATH: process.env.PATH, NODE_OPTIONS: '--max-old-space-size=300' }));
		expect(theirs).toBeGreaterThanOrEqual(300);
		expect(theirs).toBeLessThan(300 + 128);
	});
});
