/**
 * One print worker thread (started by ./pool.ts): runs the jobs of ./job.ts one at a time and
 * keeps this thread's print cache between them. Progress is posted at most every 100 ms; the
 * output's bytes are transferred to the caller.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { CACHE_AREAS, printCache, PrintCache } from './cache';
import { buildCardPressPdf, buildCardsPngZip, buildGamePdf } from './job';
import type { FromWorker, PrintJob, PrintJobResult, ToWorker, WorkerData } from './pool';

const port = parentPort;
if (!port) throw new Error('worker.ts runs as a worker thread (see ./pool.ts)');

const PROGRESS_EVERY_MS = 100;

const budget = (workerData as WorkerData | undefined)?.cacheBytes;
if (budget) printCache.resize(budget);

function post(message: FromWorker, transfer: ArrayBuffer[] = []) {
	port!.postMessage(message, transfer);
}

/** Bytes that own their whole buffer, so the buffer can be handed over without taking anything else. */
function own(bytes: Uint8Array): Uint8Array {
	return bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength ? bytes : bytes.slice();
}

async function run(id: number, job: PrintJob): Promise<Omit<PrintJobResult, 'workerId'>> {
	const started = performance.now();
	const before = printCache.stats();
	let last = 0;
	const onProgress = (done: number, total: number) => {
		const now = performance.now();
		if (done < total && now - last < PROGRESS_EVERY_MS) return;
		last = now;
		post({ id, kind: 'progress', done, total });
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
			return finish({ bytes: out.pdf, warnings: out.warnings, sheets: out.sheets, pages: out.pages });
		}
		case 'pngs': {
			const out = await buildCardsPngZip(job.game, job.art, { ...job.options, ...isolation, onProgress });
			return finish({ bytes: out.zip, warnings: out.warnings, files: out.files });
		}
		case 'press': {
			const out = await buildCardPressPdf(job.game, job.art, job.cardId, { ...job.options, ...isolation });
			return finish({ bytes: out.pdf, warnings: out.warnings });
		}
	}
}

port.on('message', async (m: ToWorker) => {
	if (m.kind === 'stats') return post({ id: m.id, kind: 'stats', stats: printCache.stats() });
	if (m.kind === 'clear') {
		printCache.clear();
		return post({ id: m.id, kind: 'stats', stats: printCache.stats() });
	}
	try {
		const result = await run(m.id, m.job);
		post({ id: m.id, kind: 'done', result }, [result.bytes.buffer as ArrayBuffer]);
	} catch (e) {
		const err = e as Error & { status?: number };
		post({ id: m.id, kind: 'error', error: { name: err.name ?? 'Error', message: err.message ?? String(e), status: err.status } });
	}
});
