/**
 * Print jobs off the main thread: a small, long-lived pool of worker threads, each running the
 * job functions of ./job.ts with its own print cache (./cache.ts). At most `size` builds run at
 * once (default 2, one per core of a small host); more wait in a queue, first come first served.
 * A rebuild of a game goes to the worker that built it last when that one is free, so its
 * cache still holds the faces and the art.
 *
 * Workers load ./worker.ts through tsx (TypeScript, no build step). Progress messages come back
 * while a job runs; the output bytes are transferred, not copied.
 */
import { existsSync } from 'node:fs';
import type { Worker } from 'node:worker_threads';
import { resolveWorkerModule, startTsWorker, type TsWorkerData } from '../threads/ts-worker';
import type { Game } from '../game/model';
import type { CacheArea, CacheStats } from './cache';
import type { CardPressOptions, GamePdfOptions, PngZipOptions } from './job';
import { PrintOptionsError } from './options';

type Plain<T> = Omit<T, 'onProgress' | 'cache'>;

/**
 * `isolated` builds with a cache of its own instead of the worker's: the bytes then never depend
 * on what the worker built before (a proof's files must come out the same every time).
 */
export type PrintJob = { isolated?: boolean } & (
	| { type: 'sheets'; game: Game; art: Map<string, Uint8Array>; options: Plain<GamePdfOptions> }
	| { type: 'pngs'; game: Game; art: Map<string, Uint8Array>; options: Plain<PngZipOptions> }
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
	/** PNG zips: files in it. */
	files?: number;
	/** The worker's cache after the job (hits and misses count since its last reset). */
	cache: CacheStats;
	/** Hits and misses of this job alone, per cache area. */
	jobCache: Record<CacheArea, { hits: number; misses: number }>;
	workerId: number;
	ms: number;
}

/** Messages between the pool and a worker. */
export type ToWorker = { id: number; kind: 'job'; job: PrintJob } | { id: number; kind: 'stats' } | { id: number; kind: 'clear' };
export type FromWorker =
	| { id: number; kind: 'progress'; done: number; total: number }
	| { id: number; kind: 'done'; result: Omit<PrintJobResult, 'workerId'> }
	| { id: number; kind: 'stats'; stats: CacheStats }
	| { id: number; kind: 'error'; error: { name: string; message: string; status?: number } };

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
}

interface Waiting {
	job: PrintJob;
	options: RunOptions;
	resolve: (r: PrintJobResult) => void;
	reject: (e: unknown) => void;
	affinity: string;
}

interface Slot {
	id: number;
	worker: Worker;
	busy?: { id: number; waiting: Waiting; started: number };
	lastAffinity?: string;
	/** Replies to stats / clear requests. */
	calls: Map<number, (m: FromWorker) => void>;
}

export const DEFAULT_POOL_SIZE = 2;
export const DEFAULT_MAX_QUEUE = 64;

/** The print worker module (see ../threads/ts-worker.ts). */
export function resolveWorkerPath(explicit?: string): string {
	return resolveWorkerModule(import.meta.url, 'worker.ts', 'src/lib/print/worker.ts', explicit);
}

export class PrintPool {
	readonly size: number;
	readonly maxQueue: number;
	readonly workerPath: string;
	private cacheBytes?: number;
	private slots: Slot[] = [];
	private queue: Waiting[] = [];
	private nextId = 1;
	private nextWorker = 1;
	private closed = false;

	constructor(options: PrintPoolOptions = {}) {
		this.size = Math.max(1, Math.floor(options.size ?? DEFAULT_POOL_SIZE));
		this.maxQueue = Math.max(0, Math.floor(options.maxQueue ?? DEFAULT_MAX_QUEUE));
		this.workerPath = resolveWorkerPath(options.workerPath);
		this.cacheBytes = options.cacheBytes;
		if (!existsSync(this.workerPath)) throw new Error(`print worker not found at ${this.workerPath}`);
	}

	/** Jobs running and waiting now. */
	get running(): number {
		return this.slots.filter((s) => s.busy).length;
	}
	get waiting(): number {
		return this.queue.length;
	}

	run(job: PrintJob, options: RunOptions = {}): Promise<PrintJobResult> {
		if (this.closed) return Promise.reject(new Error('the print pool is closed'));
		if (options.signal?.aborted) return Promise.reject(options.signal.reason ?? new Error('aborted'));
		const idle = this.slots.some((s) => !s.busy) || this.slots.length < this.size;
		if (!idle && this.queue.length >= this.maxQueue)
			return Promise.reject(new PrintBusyError(`The print queue is full (${this.maxQueue} waiting); try again in a minute`));
		return new Promise<PrintJobResult>((resolve, reject) => {
			const waiting: Waiting = { job, options, resolve, reject, affinity: options.affinity ?? job.game.slug };
			this.queue.push(waiting);
			options.signal?.addEventListener(
				'abort',
				() => {
					const at = this.queue.indexOf(waiting);
					if (at >= 0) {
						this.queue.splice(at, 1);
						reject(options.signal!.reason ?? new Error('aborted'));
					}
				},
				{ once: true }
			);
			this.dispatch();
		});
	}

	/** Each worker's cache figures (for the benchmark and tests). */
	async cacheStats(): Promise<CacheStats[]> {
		return Promise.all(
			this.slots.map((s) =>
				this.call(s, 'stats').then((m) => {
					if (m.kind !== 'stats') throw new Error('a print worker stopped before answering');
					return m.stats;
				})
			)
		);
	}

	/** Empty every worker's cache (a cold start without new threads). */
	async clearCaches(): Promise<void> {
		await Promise.all(this.slots.map((s) => this.call(s, 'clear')));
	}

	async close(): Promise<void> {
		this.closed = true;
		for (const w of this.queue.splice(0)) w.reject(new Error('the print pool is closed'));
		await Promise.all(this.slots.map((s) => s.worker.terminate()));
		this.slots = [];
	}

	private call(slot: Slot, kind: 'stats' | 'clear'): Promise<FromWorker> {
		const id = this.nextId++;
		return new Promise((resolve) => {
			slot.calls.set(id, resolve);
			slot.worker.postMessage({ id, kind } satisfies ToWorker);
		});
	}

	private spawn(): Slot {
		const worker = startTsWorker(this.workerPath, { cacheBytes: this.cacheBytes });
		const slot: Slot = { id: this.nextWorker++, worker, calls: new Map() };
		worker.on('message', (m: FromWorker) => this.onMessage(slot, m));
		worker.on('error', (e) => this.onCrash(slot, e));
		worker.on('exit', (code) => {
			if (this.slots.includes(slot)) this.onCrash(slot, new Error(`print worker stopped (exit code ${code})`));
		});
		this.slots.push(slot);
		return slot;
	}

	private dispatch(): void {
		while (this.queue.length) {
			let free = this.slots.filter((s) => !s.busy);
			if (!free.length && this.slots.length < this.size) free = [this.spawn()];
			if (!free.length) return;
			// The first waiting job whose game a free worker has cached, else the oldest.
			let pick = 0;
			let slot = free[0];
			const match = this.queue.findIndex((w) => free.some((s) => s.lastAffinity === w.affinity));
			if (match >= 0) {
				pick = match;
				slot = free.find((s) => s.lastAffinity === this.queue[match].affinity)!;
			} else {
				// Otherwise a worker that holds no other game's cache, if there is one.
				slot = free.find((s) => !s.lastAffinity) ?? free[0];
			}
			const [waiting] = this.queue.splice(pick, 1);
			const id = this.nextId++;
			slot.busy = { id, waiting, started: performance.now() };
			slot.lastAffinity = waiting.affinity;
			slot.worker.ref();
			slot.worker.postMessage({ id, kind: 'job', job: waiting.job } satisfies ToWorker);
		}
	}

	private onMessage(slot: Slot, m: FromWorker): void {
		const call = slot.calls.get(m.id);
		if (call) {
			slot.calls.delete(m.id);
			call(m);
			return;
		}
		const busy = slot.busy;
		if (!busy || busy.id !== m.id) return;
		if (m.kind === 'progress') {
			busy.waiting.options.onProgress?.(m.done, m.total);
			return;
		}
		slot.busy = undefined;
		// An idle worker must not keep a script's process alive.
		slot.worker.unref();
		if (m.kind === 'done') busy.waiting.resolve({ ...m.result, workerId: slot.id });
		else if (m.kind === 'error') busy.waiting.reject(reviveError(m.error));
		this.dispatch();
	}

	private onCrash(slot: Slot, error: Error): void {
		this.slots = this.slots.filter((s) => s !== slot);
		slot.busy?.waiting.reject(error);
		for (const call of slot.calls.values()) call({ id: 0, kind: 'error', error: { name: error.name, message: error.message } });
		void slot.worker.terminate();
		if (!this.closed) this.dispatch();
	}
}

function reviveError(e: { name: string; message: string; status?: number }): Error {
	if (e.name === 'PrintOptionsError') return new PrintOptionsError(e.message, e.status);
	const err = new Error(e.message);
	err.name = e.name;
	return err;
}

let shared: PrintPool | undefined;

/** The process's long-lived pool (created on first use), so workers and their caches persist between builds. */
export function printPool(options?: PrintPoolOptions): PrintPool {
	shared ??= new PrintPool(options);
	return shared;
}
