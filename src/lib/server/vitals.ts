/**
 * The server's own vital signs for whoever runs it: memory, event-loop delay (how late timers
 * fire, i.e. how long the main thread was kept busy) and the main thread's garbage collections.
 * Sent as one line on standard output when the process gets SIGUSR2, then the delay histogram
 * and the collection counts start over: nothing is exposed over HTTP.
 */
import { constants, monitorEventLoopDelay, PerformanceObserver, type PerformanceEntry } from 'node:perf_hooks';
import { faceCacheStats } from './face-cache';
import { gameCacheStats } from './game-store';
import { artCacheStats } from './art-files';

const NS_PER_MS = 1e6;

/** Collections since the last report: full ones (mark-compact) and young-generation ones, with their longest pause. */
function watchCollections() {
	const none = () => ({ full: 0, fullMaxMs: 0, young: 0, youngMaxMs: 0 });
	let counts = none();
	const observer = new PerformanceObserver((list) => {
		for (const entry of list.getEntries() as (PerformanceEntry & { detail?: { kind?: number } })[]) {
			const full = entry.detail?.kind === constants.NODE_PERFORMANCE_GC_MAJOR;
			if (full) counts.full++;
			else counts.young++;
			const key = full ? 'fullMaxMs' : 'youngMaxMs';
			counts[key] = Math.max(counts[key], Math.round(entry.duration * 10) / 10);
		}
	});
	observer.observe({ entryTypes: ['gc'] });
	return () => {
		const report = counts;
		counts = none();
		return report;
	};
}

/** `more` adds figures of the caller's (e.g. whether the print workers are warm). */
export function watchVitals(more: () => Record<string, unknown> = () => ({})): void {
	const loop = monitorEventLoopDelay({ resolution: 10 });
	loop.enable();
	const collections = watchCollections();
	process.on('SIGUSR2', () => {
		const m = process.memoryUsage();
		const ms = (ns: number) => Math.round((ns / NS_PER_MS) * 10) / 10;
		const vitals = {
			rssMb: Math.round(m.rss / 2 ** 20),
			heapMb: Math.round(m.heapUsed / 2 ** 20),
			heapTotalMb: Math.round(m.heapTotal / 2 ** 20),
			externalMb: Math.round(m.external / 2 ** 20),
			arrayBuffersMb: Math.round(m.arrayBuffers / 2 ** 20),
			loopDelayMs: { p50: ms(loop.percentile(50)), p99: ms(loop.percentile(99)), max: ms(loop.max) },
			gc: collections(),
			faceCache: faceCacheStats(),
			gameCache: gameCacheStats(),
			artCache: artCacheStats(),
			...more()
		};
		console.log(`paddock-vitals ${JSON.stringify(vitals)}`);
		loop.reset();
	});
}
