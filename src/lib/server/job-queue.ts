/**
 * Where queued work runs. With PGlite (one process) a job runs at once in this process, on the
 * print engine's worker pool. With a PostgreSQL server it goes through pg-boss: any process's
 * workers take it; a process that dies mid-job leaves it to expire and be retried elsewhere.
 * A job is only an id here; what to do is in the database row the id names.
 */
import PgBoss from 'pg-boss';
import { countSetting } from '../settings';

export interface JobKind {
	/** Does the work; throws to be tried again. */
	run: (id: string) => Promise<void>;
	/** After the last attempt failed. */
	giveUp: (id: string, error: unknown) => Promise<void>;
	/**
	 * Jobs of this kind started at once in this process (default: no limit). The rest wait in
	 * the queue, their rows still `queued`, and start as others finish: starting a job reads its
	 * whole request, and eight started together would hold up the server's thread for nothing
	 * while they all wait for the same few workers.
	 */
	atOnce?: () => number;
}

export interface JobQueue {
	/** True when other processes share the queue (and may retry a job this one started). */
	readonly shared: boolean;
	send: (kind: string, id: string) => Promise<void>;
	/** Stops taking work; waits for running jobs up to `timeoutMs`. */
	stop: (timeoutMs?: number) => Promise<void>;
}

const kinds = new Map<string, JobKind>();

export function defineJob(name: string, kind: JobKind) {
	kinds.set(name, kind);
}

function kindOf(name: string): JobKind {
	const kind = kinds.get(name);
	if (!kind) throw new Error(`No job kind ${name}`);
	return kind;
}

/** Runs each job in this process, at once or when one of its kind finishes (`atOnce`); one attempt. */
export function inProcessQueue(): JobQueue {
	const running = new Set<Promise<void>>();
	/** Per kind: jobs waiting for a place, and how many have started and not finished. */
	const lanes = new Map<string, { waiting: Array<() => void>; started: number }>();
	const startNext = (name: string, lane: { waiting: Array<() => void>; started: number }) => {
		const atOnce = Math.max(1, kindOf(name).atOnce?.() ?? Infinity);
		while (lane.waiting.length > 0 && lane.started < atOnce) {
			lane.started++;
			lane.waiting.shift()!();
		}
	};
	return {
		shared: false,
		async send(name, id) {
			const kind = kindOf(name);
			let lane = lanes.get(name);
			if (!lane) lanes.set(name, (lane = { waiting: [], started: 0 }));
			const p = new Promise<void>((go) => {
				lane.waiting.push(go);
				startNext(name, lane);
			})
				.then(() => kind.run(id))
				.catch((e) => kind.giveUp(id, e))
				.catch((e) => console.error(e))
				.finally(() => {
					running.delete(p);
					lane.started--;
					startNext(name, lane);
				});
			running.add(p);
		},
		async stop(timeoutMs = 30_000) {
			await Promise.race([Promise.allSettled([...running]), new Promise((ok) => setTimeout(ok, timeoutMs).unref())]);
		}
	};
}

export interface SharedQueueOptions {
	/** Tries per job (the first and the retries). */
	attempts?: number;
	/** A job running longer than this is taken as lost (its process died) and retried. */
	expireSeconds?: number;
	/** How often lost jobs are looked for. */
	maintenanceSeconds?: number;
}

/**
 * Creates a queue unless it is there. Two processes starting together may both try; PostgreSQL
 * then ends one of them with a deadlock (40P01), which is tried again after a short pause.
 */
async function createQueueOnce(boss: PgBoss, name: string, options: PgBoss.Queue) {
	for (let attempt = 1; ; attempt++) {
		try {
			if (await boss.getQueue(name)) return;
			await boss.createQueue(name, options);
			return;
		} catch (e) {
			const code = (e as { code?: string }).code;
			if ((code !== '40P01' && code !== '23505') || attempt >= 5) throw e;
			await new Promise((ok) => setTimeout(ok, 50 + Math.random() * 200 * attempt));
		}
	}
}

/** pg-boss on the PostgreSQL server: every process sends and works. */
export async function sharedQueue(databaseUrl: string, options: SharedQueueOptions = {}): Promise<JobQueue> {
	const boss = new PgBoss({
		connectionString: databaseUrl,
		max: 4,
		maintenanceIntervalSeconds: options.maintenanceSeconds ?? countSetting(process.env.PADDOCK_JOB_MAINTENANCE_SECONDS, 30)
	});
	boss.on('error', (e) => console.error(`Job queue: ${e.message}`));
	await boss.start();
	const attempts = options.attempts ?? 3;
	const expireInSeconds = options.expireSeconds ?? countSetting(process.env.PADDOCK_JOB_EXPIRE_SECONDS, 300);
	const names = [...kinds.keys()];
	for (const name of names) {
		await createQueueOnce(boss, name, { name, retryLimit: attempts - 1, retryDelay: 1, expireInSeconds, policy: 'standard' });
		const kind = kindOf(name);
		await boss.work<{ id: string }>(
			name,
			{ batchSize: 1, pollingIntervalSeconds: 1, includeMetadata: true },
			async ([job]) => {
				try {
					await kind.run(job.data.id);
				} catch (e) {
					if (job.retryCount >= job.retryLimit) await kind.giveUp(job.data.id, e);
					throw e;
				}
			}
		);
	}
	return {
		shared: true,
		async send(name, id) {
			kindOf(name);
			await boss.send(name, { id }, { singletonKey: id });
		},
		async stop(timeoutMs = 30_000) {
			await boss.stop({ graceful: true, wait: true, timeout: timeoutMs });
		}
	};
}

const slot = globalThis as typeof globalThis & { __paddockJobs?: JobQueue };

export function jobQueue(): JobQueue {
	slot.__paddockJobs ??= inProcessQueue();
	return slot.__paddockJobs;
}

export function useJobQueue(queue: JobQueue) {
	slot.__paddockJobs = queue;
}
