import { describe, expect, it } from 'vitest';
import { defineJob, inProcessQueue } from './job-queue';

describe('in-process job queue', () => {
	it('starts at most `atOnce` jobs of a kind together; the rest start as others finish, and all finish', async () => {
		let running = 0;
		let most = 0;
		const finished: string[] = [];
		const release: Array<() => void> = [];
		defineJob('limited-test', {
			atOnce: () => 2,
			run: async (id) => {
				running++;
				most = Math.max(most, running);
				await new Promise<void>((ok) => release.push(ok));
				running--;
				finished.push(id);
			},
			giveUp: async () => {}
		});
		const queue = inProcessQueue();
		for (let i = 0; i < 5; i++) await queue.send('limited-test', `j${i}`);
		// Let the first ones start; then free them one by one as they arrive.
		while (finished.length < 5) {
			await new Promise((ok) => setImmediate(ok));
			release.shift()?.();
		}
		await queue.stop(1000);
		expect(most).toBe(2);
		expect(finished.sort()).toEqual(['j0', 'j1', 'j2', 'j3', 'j4']);
	});

	it('a job that fails is given up and frees its place', async () => {
		const gaveUp: string[] = [];
		const ran: string[] = [];
		defineJob('failing-test', {
			atOnce: () => 1,
			run: async (id) => {
				ran.push(id);
				if (id === 'bad') throw new Error('no such card');
			},
			giveUp: async (id) => void gaveUp.push(id)
		});
		const queue = inProcessQueue();
		await queue.send('failing-test', 'bad');
		await queue.send('failing-test', 'good');
		await queue.stop(1000);
		expect(ran).toEqual(['bad', 'good']);
		expect(gaveUp).toEqual(['bad']);
	});
});
