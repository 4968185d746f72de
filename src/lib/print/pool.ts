/**
 * Print jobs off the main thread: a long-lived pool of worker threads (piscina), each running the
 * job functions of ./job.ts with its own print cache (./cache.ts). At most `size` builds run at
 * once (default: one per core but one); up to `maxQueue` more wait, and past that `run` refuses
 * with PrintBusyError (HTTP 503), unless the job was admitted by a bounded queue of its own. A
 * rebuild of a game goes to the worker that built it last when that one is free, so its cache
 * still holds the faces and the art.
 *
 * `idleSize` workers (one by default) start with the pool and load the fonts and the WebAssembly
 * rasteriser before they take a job (see ./worker.ts), so the first build after a start is not
 * the slow one; the others start when builds queue up and stop after a quiet minute. They run
 * at a lower scheduling priority than the server's own thread, so builds never starve requests.
 *
 * A worker that drew PNGs is replaced by a fresh, warm one after the same quiet minute. Drawing
 * at 300 dpi grows the rasteriser's WebAssembly memory by some 25 MB, which a thread can never
 * give back, and fills the cache with PNGs; a worker that only built sheets keeps its cache.
 *
 * Callers see only `PrintRunner` (run, close), so the pool can be swapped for a queue elsewhere.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { once } from 'node:events';
import { MessageChannel, type MessagePort } from 'node:worker_threads';
import { Piscina } from 'piscina';
import type { Game } from '../game/model';
import type { CacheArea, CacheStats } from './cache';
import type { CardPressOptions } from './press-job';
import type { GamePdfOptions } from './sheet-job';
import type { PngPart, PngShard, PngZipOptions } from './png-job';
import { PrintOptionsError } from './options';
import { resolveCompiledWorker, tsxEsmApi, type TsWorkerData } from '../threads/ts-worker';
import { WORKER_NICE } from '../threads/priority';
import { countSetting } from '../settings';

type Plain<T> = Omit<T, 'onProgress' | 'cache'>;

/**
 * `isolated` builds with a cache of its own instead of the worker's: the bytes then never depend
 * on what the worker built before (a proof's files must come out the same every time).
 */
export type PrintJob = { isolated?: boolean } & (
	| { type: 'sheets'; game: Game; art: Map<string, Uint8Array>; options: Plain<GamePdfOptions> }
	| { type: 'pngs'; game: Game; art: Map<string, Uint8Array>; options: Plain<PngZipOptions> }
	/** One share of a PNG zip's faces, so every worker draws some (see `renderPngPart`). */
	| { type: 'png-part'; game: Game; art: Map<string, Uint8Array>; options: Plain<PngZipOptions> & { shard: PngShard } }
	| { type: 'press'; game: Game; art: Map<string, Uint8Array>; cardId: string; options: Plain<CardPressOptions> }
);

export interface PrintJobResult {
	type: PrintJob['type'];
	/** The PDF or the zip. */
	bytes: Uint8Array;
	warnings: string[];
	/** Sheet PDFs: sheets of paper and pages. */
	sheets?: number;
	pages?: number;
	/** Of `pages`, those of the cutting guide. */
	guidePages?: number;
	/** PNG zips: files in it. */
	files?: number;
	/** A share of a PNG zip: its files (`bytes` is then empty). */
	part?: PngPart;
	/** The worker's cache after the job (hits and misses count since its last reset). */
	cache: CacheStats;
	/** Hits and misses of this job alone, per cache area. */
	jobCache: Record<CacheArea, { hits: number; misses: number }>;
	workerId: number;
	ms: number;
}

/** What a worker task carries: a job, or a question about the worker's cache. */
export type WorkerTask = { kind: 'job'; job: PrintJob; progress?: MessagePort } | { kind: 'stats' };
export type ProgressMessage = { done: number; total: number };
/** A job that failed in the worker, as data (an Error loses its name and status between threads). */
export type WorkerFailure = { failed: { name: string; message: string; status?: number } };

/** What a worker is started with. */
export interface WorkerData extends TsWorkerData {
	cacheBytes?: number;
}

/** Refused because the queue is full: the caller should try again later (HTTP 503). */
export class PrintBusyError extends Error {
	readonly status = 503;
	constructor(message: string) {
		super(message);
		this.name = 'PrintBusyError';
	}
}

export interface PrintPoolOptions {
	/** Builds at the same time (worker threads). */
	size?: number;
	/** Workers that stay started while idle (default 1); the rest start when builds queue. */
	idleSize?: number;
	/**
	 * How long the pool may sit quiet before an extra worker stops and a worker that drew PNGs is
	 * replaced (default a minute).
	 */
	idleMs?: number;
	/** Jobs allowed to wait; beyond this `run` refuses with PrintBusyError. */
	maxQueue?: number;
	/** The worker module, when it is not beside this file (e.g. once the app is bundled). */
	workerPath?: string;
	/** Each worker's cache budget in bytes (see ./cache.ts). */
	cacheBytes?: number;
}

export interface RunOptions {
	onProgress?: (done: number, total: number) => void;
	/** Jobs with the same affinity prefer the same worker (default: the game's slug). */
	affinity?: string;
	/** Aborting drops the job if it is still waiting. */
	signal?: AbortSignal;
	/** Already given a place by a bounded queue of the caller's: never refused for a full pool. */
	admitted?: boolean;
}

/** What the app needs of a print pool; another runner (a shared queue) can stand in. */
export interface PrintRunner {
	run(job: PrintJob, options?: RunOptions): Promise<PrintJobResult>;
	close(): Promise<void>;
}

/**
 * Builds are CPU-bound: one worker per core but one, which stays with the server's own thread (and
 * the embedded database, which runs on it), or as many as PADDOCK_PRINT_WORKERS says. On two
 * cores, one worker against two: /api/v1/me during eight builds answered within 25.9 ms against
 * 29.8 at the 99th percentile (p95 16.8 against 20.0 ms), and the eight builds took about as long.
 */
export function defaultPoolSize(env = process.env.PADDOCK_PRINT_WORKERS, cores = availableParallelism()): number {
	return countSetting(env, Math.max(1, cores - 1));
}
export const DEFAULT_MAX_QUEUE = 16;
export const DEFAULT_IDLE_SIZE = 1;
const DEFAULT_IDLE_MS = 60_000;
const WORKER_YOUNG_MB = 8;

/**
 * Where the worker module is: beside this file when running from source (../threads/ts-worker.ts);
 * the compiled worker (`npm run build` writes build/print-worker.js) once this file is bundled.
 */
export function resolveWorkerPath(explicit?: string): string {
	return resolveCompiledWorker(import.meta.url, 'worker.ts', 'src/lib/print/worker.ts', 'print-worker.js', explicit);
}

/** The worker's first module: plain JavaScript that loads the real worker (through tsx when it is TypeScript). */
function entryFile(): string {
	const here = (() => {
		try {
			return dirname(fileURLToPath(import.meta.url));
		} catch {
			return undefined;
		}
	})();
	const candidates = [here && join(here, 'worker-entry.js'), resolve(process.cwd(), 'src/lib/print/worker-entry.js')];
	const found = candidates.find((c) => c && existsSync(c));
	if (!found) throw new Error('print worker entry (worker-entry.js) not found');
	return found;
}

interface QueueOptions {
	affinity: string;
}

export class PrintPool implements PrintRunner {
	readonly size: number;
	/** Workers kept started (and warm) while nothing is being built. */
	readonly idleSize: number;
	readonly maxQueue: number;
	readonly workerPath: string;
	private piscina: Piscina<WorkerTask, unknown>;
	/** The game each live worker built last (by piscina's worker id; a stopped worker's entry goes). */
	private lastAffinity = new Map<number, string>();
	private inFlight = 0;
	private warm: Promise<void>;
	/** Workers that drew PNGs since they started (by piscina's worker id), and those being replaced. */
	private drewPngs = new Set<number>();
	private readonly leaving = new Set<number>();
	private lastJobEnded = performance.now();
	private replacer: ReturnType<typeof setInterval>;

	constructor(options: PrintPoolOptions = {}) {
		this.size = Math.max(1, Math.floor(options.size ?? defaultPoolSize()));
		this.idleSize = Math.min(this.size, Math.max(1, Math.floor(options.idleSize ?? DEFAULT_IDLE_SIZE)));
		this.maxQueue = Math.max(0, Math.floor(options.maxQueue ?? DEFAULT_MAX_QUEUE));
		this.workerPath = resolveWorkerPath(options.workerPath);
		if (!existsSync(this.workerPath)) throw new Error(`print worker not found at ${this.workerPath}`);
		const direct = this.workerPath.endsWith('.js');
		const workerData: WorkerData = {
			entry: pathToFileURL(this.workerPath).href,
			tsx: direct ? undefined : tsxEsmApi(),
			cacheBytes: options.cacheBytes
		};
		const idleMs = options.idleMs ?? DEFAULT_IDLE_MS;
		this.piscina = new Piscina({
			filename: direct ? this.workerPath : entryFile(),
			workerData,
			// `idleSize` workers start now, warm up and stay; more start when builds queue and
			// leave after a quiet minute (each thread holds tens of MB of code, fonts and wasm).
			minThreads: this.idleSize,
			maxThreads: this.size,
			idleTimeout: this.idleSize === this.size ? Infinity : idleMs,
			// The bound is kept in `run`: jobs a caller's bounded queue admitted wait here whatever the count.
			concurrentTasksPerWorker: 1,
			// Idle workers wait on a message port, so a job's own async work is never parked.
			atomics: 'disabled',
			// Worker threads yield the CPU to the server's thread (Linux nice value; the worker sets
			// it again itself, see ../threads/priority.ts, should piscina's optional helper be missing).
			niceIncrement: WORKER_NICE,
			// A smaller young generation: builds allocate in short bursts, and every megabyte a
			// thread's heap grew to stays resident while the thread lives.
			resourceLimits: { maxYoungGenerationSizeMb: WORKER_YOUNG_MB },
			loadBalancer: (task, workers) => {
				// Workers come and go (idle ones stop): forget the ones that are gone.
				if (this.lastAffinity.size > workers.length) {
					const live = new Set(workers.map((w) => w.id));
					for (const id of this.lastAffinity.keys()) if (!live.has(id)) this.lastAffinity.delete(id);
				}
				const free = workers.filter((w) => w.currentUsage === 0 && !w.terminating && !w.destroyed && !this.leaving.has(w.id));
				if (!free.length) return null;
				const affinity = ((task as unknown as Record<symbol, unknown>)[Piscina.queueOptionsSymbol] as QueueOptions | null)?.affinity;
				const same = affinity ? free.find((w) => this.lastAffinity.get(w.id) === affinity) : undefined;
				// Else a worker that holds no other game's cache, if there is one.
				const pick = same ?? free.find((w) => !this.lastAffinity.has(w.id)) ?? free[0];
				if (affinity) this.lastAffinity.set(pick.id, affinity);
				return pick;
			}
		});
		// A worker that failed to start must not bring the server down; its jobs fail instead.
		this.piscina.on('error', (e) => console.error('print worker error:', e));
		let warmed = 0;
		this.warm = new Promise((resolve) => {
			const onMessage = (m: unknown) => {
				if ((m as { warm?: boolean })?.warm && ++warmed >= this.idleSize) {
					this.piscina.off('message', onMessage);
					resolve();
				}
			};
			this.piscina.on('message', onMessage);
		});
		this.replacer = setInterval(() => this.replaceQuietWorkers(idleMs), Math.min(10_000, idleMs / 2));
		this.replacer.unref();
	}

	/**
	 * Once nothing has run for `quietMs`, each worker that drew PNGs stops; piscina starts a new
	 * one in its place, which warms up as every worker does. Only here, on the server's thread and
	 * with no job in flight, so no job can be on its way to a worker that is stopping.
	 */
	private replaceQuietWorkers(quietMs: number): void {
		if (this.inFlight || !this.drewPngs.size || performance.now() - this.lastJobEnded < quietMs) return;
		const drew = this.drewPngs;
		// Ids of extra workers that have stopped meanwhile go with the old set.
		this.drewPngs = new Set();
		for (const worker of this.piscina.threads) {
			const id = worker.threadId;
			if (!drew.has(id)) continue;
			this.leaving.add(id);
			this.lastAffinity.delete(id);
			void worker.terminate().finally(() => this.leaving.delete(id));
		}
	}

	/** Jobs running and waiting now. */
	get running(): number {
		return Math.min(this.size, this.inFlight - this.piscina.queueSize);
	}
	/** Worker threads started now (idle ones stop after a quiet spell). */
	get threads(): number {
		return this.piscina.threads.length;
	}
	get waiting(): number {
		return this.piscina.queueSize;
	}
	/** Whether a new job would be refused now. */
	get full(): boolean {
		return this.inFlight >= this.size + this.maxQueue;
	}

	/** Resolves once the idle workers have loaded their fonts and wasm (each says so when it is warm). */
	ready(): Promise<void> {
		return this.warm;
	}

	async run(job: PrintJob, options: RunOptions = {}): Promise<PrintJobResult> {
		if (options.signal?.aborted) throw options.signal.reason ?? new Error('aborted');
		if (!options.admitted && this.full) throw new PrintBusyError('The print queue is full; try again in a minute');
		const channel = options.onProgress ? new MessageChannel() : undefined;
		// The worker closes its end when the job is over, after its last progress message.
		const progressDone = channel ? once(channel.port1, 'close') : undefined;
		if (channel) {
			channel.port1.on('message', (m: ProgressMessage) => options.onProgress!(m.done, m.total));
			channel.port1.unref();
		}
		const task = {
			kind: 'job' as const,
			job,
			progress: channel?.port2,
			[Piscina.queueOptionsSymbol]: { affinity: options.affinity ?? job.game.slug } satisfies QueueOptions
		};
		this.inFlight++;
		let out: PrintJobResult | WorkerFailure;
		try {
			out = (await this.piscina.run(task, {
				transferList: channel ? [channel.port2] : [],
				signal: options.signal ?? null
			})) as PrintJobResult | WorkerFailure;
		} catch (e) {
			channel?.port1.close();
			throw e;
		} finally {
			this.inFlight--;
			this.lastJobEnded = performance.now();
		}
		await progressDone;
		if ('failed' in out) throw reviveError(out.failed);
		if (job.type === 'pngs' || job.type === 'png-part') this.drewPngs.add(out.workerId);
		return out;
	}

	/** One worker's cache figures (for the benchmark and tests; with one worker, that worker's). */
	async cacheStats(): Promise<CacheStats> {
		return (await this.piscina.run({ kind: 'stats' })) as CacheStats;
	}

	async close(): Promise<void> {
		clearInterval(this.replacer);
		await this.piscina.close({ force: true });
	}
}

function reviveError(e: WorkerFailure['failed']): Error {
	if (e.name === 'PrintOptionsError') return new PrintOptionsError(e.message, e.status);
	return Object.assign(new Error(e.message), { name: e.name, status: e.status });
}

const shared = globalThis as typeof globalThis & { __paddockPrintPool?: PrintPool };

/** The process's long-lived pool (created on first use, or at server start), so workers and their caches persist between builds. */
export function printPool(options?: PrintPoolOptions): PrintPool {
	shared.__paddockPrintPool ??= new PrintPool(options);
	return shared.__paddockPrintPool;
}

/** Closes the process's pool, if one was started (server shutdown). */
export async function closePrintPool(): Promise<void> {
	const pool = shared.__paddockPrintPool;
	shared.__paddockPrintPool = undefined;
	await pool?.close();
}
