import { afterEach, describe, expect, it, vi } from 'vitest';
import type { EventLoopUtilization } from 'node:perf_hooks';
import { collectWhenQuiet, fullGc, shouldCollect } from './quiet-gc';

const MB = 2 ** 20;
const limits = { quietBelow: 0.05, grownBytes: 32 * MB };

describe('shouldCollect', () => {
	it('collects a quiet thread whose heap grew past the threshold', () => {
		expect(shouldCollect(0.01, 200 * MB, 100 * MB, limits)).toBe(true);
	});
	it('leaves a busy thread alone, however much garbage it holds', () => {
		expect(shouldCollect(0.5, 400 * MB, 100 * MB, limits)).toBe(false);
	});
	it('leaves a quiet thread alone when its heap has barely grown', () => {
		expect(shouldCollect(0, 110 * MB, 100 * MB, limits)).toBe(false);
	});
});

describe('collectWhenQuiet', () => {
	afterEach(() => vi.useRealTimers());

	/** A thread whose busy share and heap the test sets; collecting brings the heap back to `live`. */
	function fakeThread(live: number) {
		const thread = { busy: 0, heap: live, collections: 0 };
		const utilisation = (since?: EventLoopUtilization): EventLoopUtilization => ({ idle: 0, active: 0, utilization: since ? thread.busy : 0 });
		const collect = () => {
			thread.collections++;
			thread.heap = live;
		};
		return { thread, utilisation, collect };
	}

	it('collects once the thread goes quiet, and not again until the heap grows anew', () => {
		vi.useFakeTimers();
		const { thread, utilisation, collect } = fakeThread(100 * MB);
		const stop = collectWhenQuiet({ everyMs: 1000 }, collect, () => thread.heap, utilisation);
		// Busy, garbage piling up: no collection.
		thread.busy = 0.9;
		thread.heap = 300 * MB;
		vi.advanceTimersByTime(3000);
		expect(thread.collections).toBe(0);
		// Quiet: one collection.
		thread.busy = 0.01;
		vi.advanceTimersByTime(1000);
		expect(thread.collections).toBe(1);
		expect(thread.heap).toBe(100 * MB);
		// Still quiet, nothing new: none.
		vi.advanceTimersByTime(5000);
		expect(thread.collections).toBe(1);
		stop();
	});

	it('counts growth from a collection V8 made on its own', () => {
		vi.useFakeTimers();
		const { thread, utilisation, collect } = fakeThread(100 * MB);
		thread.heap = 150 * MB;
		const stop = collectWhenQuiet({ everyMs: 1000 }, collect, () => thread.heap, utilisation);
		// The heap fell below where it was when the watch began: V8 collected by itself.
		thread.heap = 90 * MB;
		vi.advanceTimersByTime(1000);
		thread.heap = 125 * MB;
		vi.advanceTimersByTime(1000);
		expect(thread.collections).toBe(1);
		stop();
	});
});

describe('fullGc', () => {
	it('frees what nothing refers to any more', async () => {
		// A WeakRef's target survives until the current job ends (ECMA-262 §9.10, KeepDuringJob): look in a later turn.
		const ref = await new Promise<WeakRef<object>>((resolve) => resolve(new WeakRef({ payload: new Array(1000).fill(1) })));
		await new Promise((r) => setImmediate(r));
		fullGc();
		expect(ref.deref()).toBeUndefined();
	});
});
