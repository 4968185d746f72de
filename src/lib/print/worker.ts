/**
 * One print worker thread (started by ./pool.ts through piscina): runs the jobs of ./job.ts one
 * at a time and keeps this thread's print cache between them. It loads the fonts and the
 * WebAssembly rasteriser as it starts, before its first job, and tells the pool when it is warm.
 * Progress goes out on the job's own port at most every 100 ms; the output's bytes are
 * transferred to the caller, not copied.
 */
import { parentPort, threadId, type MessagePort } from 'node:worker_threads';
import { Piscina, workerData } from 'piscina';
import { CACHE_AREAS, printCache, PrintCache, type CacheStats } from './cache';
import { loadFonts } from './fonts';
import { buildCardPressPdf } from './press-job';
import { buildCardsPngZip, renderPngPart } from './png-job';
import { buildGamePdf } from './sheet-job';
import { resvgReady } from './png';
import { lowerThreadPriority } from '../threads/priority';
import { collectWhenQuiet } from '../threads/quiet-gc';
import type { PrintJob, PrintJobResult, ProgressMessage, WorkerData, WorkerFailure, WorkerTask } from './pool';

const PROGRESS_EVERY_MS = 100;

// Builds yield the CPU to the server's own thread.
lowerThreadPriority();

const budget = (workerData as WorkerData | undefined)?.cacheBytes;
if (budget) printCache.resize(budget);

// Warm before the first job: fonts decompressed and parsed, resvg's wasm compiled.
await Promise.all([loadFonts(), resvgReady()]);
parentPort?.postMessage({ warm: true });

// A build leaves garbage behind; a worker that stays started gives it back between builds.
collectWhenQuiet();

/** Bytes that own their whole buffer, so the buffer can be handed over without taking anything else. */
function own(bytes: Uint8Array): Uint8Array {
	return bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength ? bytes : bytes.slice();
}

async function run(job: PrintJob, progress?: MessagePort): Promise<Omit<PrintJobResult, 'workerId'>> {
	const started = performance.now();
	const before = printCache.stats();
	let last = 0;
	const onProgress = (done: number, total: number) => {
		const now = performance.now();
		if (done < total && now - last < PROGRESS_EVERY_MS) return;
		last = now;
		progress?.postMessage({ done, total } satisfies ProgressMessage);
	};
	const finish = (r: Omit<PrintJobResult, 'workerId' | 'cache' | 'jobCache' | 'ms' | 'type'>) => {
		const after = printCache.stats();
		return {
			type: job.type,
			...r,
			bytes: own(r.bytes),
			cache: after,
			jobCache: Object.fromEntries(
				CACHE_AREAS.map((a) => [a, { hits: after[a].hits - before[a].hits, misses: after[a].misses - before[a].misses }])
			) as PrintJobResult['jobCache'],
			ms: performance.now() - started
		};
	};
	const isolation = job.isolated ? { cache: new PrintCache() } : {};
	switch (job.type) {
		case 'sheets': {
			const out = await buildGamePdf(job.game, job.art, { ...job.options, ...isolation, onProgress });
			return finish({ bytes: out.pdf, warnings: out.warnings, sheets: out.sheets, pages: out.pages, guidePages: out.guidePages });
		}
		case 'pngs': {
			const out = await buildCardsPngZip(job.game, job.art, { ...job.options, ...isolation, onProgress });
			return finish({ bytes: out.zip, warnings: out.warnings, files: out.files });
		}
		case 'png-part': {
			// The PNGs stay in this worker's cache: they are copied out, not transferred.
			const part = await renderPngPart(job.game, job.art, { ...job.options, ...isolation, onProgress });
			return finish({ bytes: new Uint8Array(0), warnings: part.warnings, files: part.total, part });
		}
		case 'press': {
			const out = await buildCardPressPdf(job.game, job.art, job.cardId, { ...job.options, ...isolation });
			return finish({ bytes: out.pdf, warnings: out.warnings });
		}
	}
}

export default async function task(t: WorkerTask): Promise<unknown> {
	if (t.kind === 'stats') return printCache.stats() satisfies CacheStats;
	try {
		const result: PrintJobResult = { ...(await run(t.job, t.progress)), workerId: threadId };
		// Hand the output's buffer over instead of copying it.
		const handover = { [Piscina.transferableSymbol]: [result.bytes.buffer], [Piscina.valueSymbol]: result };
		return Piscina.move(handover as unknown as Parameters<typeof Piscina.move>[0]);
	} catch (e) {
		// A thrown error crosses threads without its name and status: send them as data.
		const err = e as Error & { status?: number };
		return { failed: { name: err.name ?? 'Error', message: err.message ?? String(e), status: err.status } } satisfies WorkerFailure;
	} finally {
		t.progress?.close();
	}
}
