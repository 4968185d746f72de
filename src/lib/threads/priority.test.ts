/**
 * Worker threads lower their own scheduling priority and no other thread's. Checked in a Node
 * process of its own against the kernel's figures for each thread, from
 * /proc/<pid>/task/<tid>/stat (proc(5)): field 19 is the nice value, field 41 the scheduling
 * policy, numbered as in sched(7) and <linux/sched.h> (0 SCHED_OTHER, 5 SCHED_IDLE).
 */
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { WORKER_NICE, workerPriority } from './priority';

const SCHED_OTHER = 0;
const SCHED_IDLE = 5;

/** Every thread of a fresh process after its main thread lowered itself: [tid is main, nice, policy]. */
function threadsAfterLowering(priority: string): { main: boolean; nice: number; policy: number }[] {
	const script = `
		import { readdirSync, readFileSync } from 'node:fs';
		import { lowerThreadPriority } from ${JSON.stringify(join(import.meta.dirname, 'priority.ts'))};
		lowerThreadPriority(${JSON.stringify(priority)});
		const threads = readdirSync('/proc/self/task').map((tid) => {
			const fields = readFileSync('/proc/self/task/' + tid + '/stat', 'utf8').split(') ')[1].split(' ');
			return { main: Number(tid) === process.pid, nice: Number(fields[16]), policy: Number(fields[38]) };
		});
		console.log(JSON.stringify(threads));`;
	const out = execFileSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], {
		encoding: 'utf8',
		env: { ...process.env, NODE_OPTIONS: '' }
	});
	return JSON.parse(out);
}

describe('worker thread priority', () => {
	it('is the idle policy unless PADDOCK_WORKER_PRIORITY says low', () => {
		expect(workerPriority(undefined)).toBe('idle');
		expect(workerPriority('idle')).toBe('idle');
		expect(workerPriority(' LOW ')).toBe('low');
		expect(workerPriority('lowest')).toBe('idle');
	});

	it.skipIf(!existsSync('/proc/self/task'))('puts the calling thread, and no other, under the idle policy at the workers\' nice value', () => {
		const threads = threadsAfterLowering('idle');
		expect(threads.filter((t) => t.main)).toEqual([{ main: true, nice: WORKER_NICE, policy: SCHED_IDLE }]);
		const others = threads.filter((t) => !t.main);
		expect(others.length).toBeGreaterThan(0);
		for (const t of others) expect(t.policy).toBe(SCHED_OTHER);
	});

	it.skipIf(!existsSync('/proc/self/task'))('set to low, lowers the nice value and keeps the ordinary policy', () => {
		const threads = threadsAfterLowering('low');
		expect(threads.filter((t) => t.main)).toEqual([{ main: true, nice: WORKER_NICE, policy: SCHED_OTHER }]);
		for (const t of threads) expect(t.policy).toBe(SCHED_OTHER);
	});
});
