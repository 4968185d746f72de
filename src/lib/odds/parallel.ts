/**
 * Monte Carlo across the cores: worker threads (./worker.ts) take chunks of samples one at a
 * time and send back their tallies; the pool adds them up, reports progress after every chunk
 * and stops handing out chunks when the caller cancels. Chunk k always uses the seed's
 * generator jumped k times and tallies are exact integers, so the answer is the same on 1 or
 * on 8 threads. One job runs at a time; others wait their turn.
 */
import { availableParallelism } from 'node:os';
import type { Worker } from 'node:worker_threads';
import { resolveCompiledWorker, startTsWorker } from '../threads/ts-worker';
import { addRaceTally, emptyRaceTally, raceOddsFromTally, type RaceOdds, type RaceSetup, type RaceTally } from './race';
import { rankedRunners, type Scenario } from './scenario';
import { addTally, chunkCount, emptyTally, stageOddsFromTally, type StageOdds, type Tally } from './stage';

export type OddsJob =
	| { kind: 'stage'; scenario: Scenario; samples: number; seed: number }
	| { kind: 'race'; setup: RaceSetup; races: number; seed: number };

export type OddsJobResult =
	| { kind: 'stage'; odds: StageOdds; samples: number; seed: number; threads: number; ms: number }
	| { kind: 'race'; odds: RaceOdds; races: number; seed: number; threads: number; ms: number };

/** Messages between the pool and a worker. */
export type ToOddsWorker = { jobId: number; job?: OddsJob; chunk: number };
export type FromOddsWorker =
	| { jobId: number; chunk: number; kind: 'stage'; tally: Tally }
	| { jobId: number; chunk: number; kind: 'race'; tally: RaceTally }
	| { jobId: number; chunk: number; kind: 'error'; message: string };

export class OddsCancelled extends Error {
	constructor() {
		super('The run was cancelled');
		this.name = 'OddsCancelled';
	}
}

export interface OddsRunOptions {
	onProgress?: (done: number, total: number) => void;
	signal?: AbortSignal;
}

interface Running {
	id: number;
	job: OddsJob;
	chunks: number;
	next: number;
	done: number;
	started: number;
	stage?: Tally;
	race?: RaceTally;
	/** Workers that already hold this job compiled. */
	told: Set<Worker>;
	options: OddsRunOptions;
	resolve: (r: OddsJobResult) => void;
	reject: (e: unknown) => void;
	failed?: boolean;
}

const units = (job: OddsJob) => (job.kind === 'stage' ? job.samples : job.races);

export class OddsPool {
	readonly size: number;
	private workerPath: string;
	private workers: Worker[] = [];
	private busy = new Set<Worker>();
	private queue: Running[] = [];
	private current?: Running;
	private nextId = 1;
	private closed = false;

	constructor(options: { size?: number; workerPath?: string } = {}) {
		this.size = Math.max(1, Math.floor(options.size ?? availableParallelism()));
		this.workerPath = resolveCompiledWorker(import.meta.url, 'worker.ts', 'src/lib/odds/worker.ts', 'odds-worker.js', options.workerPath);
	}

	/** Jobs waiting behind the one running. */
	get waiting(): number {
		return this.queue.length;
	}

	run(job: OddsJob, options: OddsRunOptions = {}): Promise<OddsJobResult> {
		if (this.closed) return Promise.reject(new Error('the odds pool is closed'));
		if (options.signal?.aborted) return Promise.reject(new OddsCancelled());
		return new Promise((resolve, reject) => {
			const total = units(job);
			const running: Running = {
				id: this.nextId++,
				job,
				chunks: chunkCount(total),
				next: 0,
				done: 0,
				started: 0,
				told: new Set(),
				options,
				resolve,
				reject
			};
			if (job.kind === 'stage') running.stage = emptyTally(rankedRunners(job.scenario).length);
			else running.race = emptyRaceTally(job.setup);
			options.signal?.addEventListener('abort', () => this.cancel(running), { once: true });
			this.queue.push(running);
			this.pump();
		});
	}

	async close(): Promise<void> {
		this.closed = true;
		for (const r of this.queue.splice(0)) r.reject(new Error('the odds pool is closed'));
		if (this.current) this.current.reject(new Error('the odds pool is closed'));
		this.current = undefined;
		await Promise.all(this.workers.map((w) => w.terminate()));
		this.workers = [];
	}

	private cancel(r: Running): void {
		const at = this.queue.indexOf(r);
		if (at >= 0) this.queue.splice(at, 1);
		if (this.current === r) this.current = undefined;
		r.failed = true;
		r.reject(new OddsCancelled());
		this.pump();
	}

	private pump(): void {
		if (!this.current) {
			const next = this.queue.shift();
			if (!next) {
				for (const w of this.workers) if (!this.busy.has(w)) w.unref();
				return;
			}
			this.current = next;
			next.started = performance.now();
			next.options.onProgress?.(0, units(next.job));
		}
		const r = this.current;
		while (this.workers.length < Math.min(this.size, r.chunks)) this.spawn();
		for (const w of this.workers) {
			if (this.busy.has(w) || r.next >= r.chunks) continue;
			const chunk = r.next++;
			this.busy.add(w);
			w.ref();
			const message: ToOddsWorker = { jobId: r.id, chunk, ...(r.told.has(w) ? {} : { job: r.job }) };
			r.told.add(w);
			w.postMessage(message);
		}
	}

	private spawn(): void {
		const w = startTsWorker(this.workerPath, {});
		w.on('message', (m: FromOddsWorker) => this.onMessage(w, m));
		const crash = (e: Error) => {
			this.workers = this.workers.filter((x) => x !== w);
			this.busy.delete(w);
			if (this.current && !this.closed) {
				const r = this.current;
				this.current = undefined;
				r.failed = true;
				r.reject(e);
			}
			if (!this.closed) this.pump();
		};
		w.on('error', crash);
		w.on('exit', (code) => {
			if (this.workers.includes(w)) crash(new Error(`odds worker stopped (exit code ${code})`));
		});
		this.workers.push(w);
	}

	private onMessage(w: Worker, m: FromOddsWorker): void {
		this.busy.delete(w);
		const r = this.current;
		if (!r || r.id !== m.jobId) {
			// A chunk of a cancelled job: its worker is free again.
			this.pump();
			return;
		}
		if (m.kind === 'error') {
			this.current = undefined;
			r.failed = true;
			r.reject(new Error(m.message));
			this.pump();
			return;
		}
		if (m.kind === 'stage') addTally(r.stage!, m.tally);
		else addRaceTally(r.race!, m.tally);
		r.done++;
		const total = units(r.job);
		const doneUnits = r.stage ? r.stage.samples : r.race!.races;
		if (r.done < r.chunks) {
			r.options.onProgress?.(doneUnits, total);
			this.pump();
			return;
		}
		this.current = undefined;
		const ms = performance.now() - r.started;
		const threads = Math.min(this.size, r.chunks);
		if (r.job.kind === 'stage') {
			const runners = rankedRunners(r.job.scenario);
			r.resolve({ kind: 'stage', odds: stageOddsFromTally(runners, r.stage!), samples: r.job.samples, seed: r.job.seed, threads, ms });
		} else {
			r.resolve({ kind: 'race', odds: raceOddsFromTally(r.job.setup, r.race!), races: r.job.races, seed: r.job.seed, threads, ms });
		}
		r.options.onProgress?.(total, total);
		this.pump();
	}
}

let shared: OddsPool | undefined;

/** The process's long-lived pool, one thread per core (created on first use). */
export function oddsPool(): OddsPool {
	shared ??= new OddsPool();
	return shared;
}
