/**
 * A full garbage collection once a thread has gone quiet. V8 collects when it runs short of room,
 * not when the work stops: after a busy spell a thread can sit for hours on a heap of garbage
 * several times the size of what it still uses, all of it resident. Collected in a quiet moment,
 * the pages go back to the system at no cost to anyone waiting.
 */
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { performance, type EventLoopUtilization } from 'node:perf_hooks';

let collector: (() => void) | undefined;

/**
 * How far a heap may grow past what it still uses after a full collection before the next one:
 * 100 lets it double. Left to itself V8 sets this from how fast it collects against how fast the
 * thread allocates, and on the server's thread, while print builds were answered, that came to
 * some 1.4×: a full collection every half second, each stopping the thread for 7–14 ms, and
 * requests waited behind them (12 in 64 sheet builds, seen with --trace-gc). At twice, one. The
 * room taken meanwhile is given back by the collection when the thread goes quiet (below).
 */
export const HEAP_GROWTH_PERCENT = 100;

/** Sets the heap growth for every thread of the process (a V8 setting, read at each collection). */
export function growHeapsBeforeCollecting(percent = HEAP_GROWTH_PERCENT): void {
	setFlagsFromString(`--heap-growing-percent=${percent}`);
}

/** V8's own full collection (the flag only makes the function reachable; nothing else changes). */
export function fullGc(): void {
	if (!collector) {
		setFlagsFromString('--expose-gc');
		collector = runInNewContext('gc') as () => void;
	}
	collector();
}

export interface QuietGcOptions {
	/** How often the thread is looked at. */
	everyMs?: number;
	/** Busy share of the last look's spell (event-loop utilisation, 0–1) below which the thread counts as quiet. */
	quietBelow?: number;
	/** Heap grown by at least this many bytes since the last collection here before one is worth it. */
	grownBytes?: number;
}

/** Whether to collect now: quiet since the last look, and the heap has grown enough since the last collection. */
export function shouldCollect(busyShare: number, heapUsed: number, heapAfterLast: number, options: Required<Omit<QuietGcOptions, 'everyMs'>>): boolean {
	return busyShare < options.quietBelow && heapUsed - heapAfterLast >= options.grownBytes;
}

/**
 * Looks at the thread every `everyMs` and collects when it was quiet meanwhile and its heap grew.
 * `collect` and `heapUsed` are for tests. Returns a function that stops the looking.
 */
export function collectWhenQuiet(
	options: QuietGcOptions = {},
	collect: () => void = fullGc,
	heapUsed: () => number = () => process.memoryUsage().heapUsed,
	utilisation: (since?: EventLoopUtilization) => EventLoopUtilization = (since) => performance.eventLoopUtilization(since)
): () => void {
	const limits = { quietBelow: options.quietBelow ?? 0.05, grownBytes: options.grownBytes ?? 32 * 2 ** 20 };
	let heapAfterLast = heapUsed();
	let mark = utilisation();
	const timer = setInterval(() => {
		const spell = utilisation(mark);
		mark = utilisation();
		// V8 collected on its own meanwhile: growth counts from there.
		heapAfterLast = Math.min(heapAfterLast, heapUsed());
		if (!shouldCollect(spell.utilization, heapUsed(), heapAfterLast, limits)) return;
		collect();
		heapAfterLast = heapUsed();
	}, options.everyMs ?? 10_000);
	timer.unref();
	return () => clearInterval(timer);
}
