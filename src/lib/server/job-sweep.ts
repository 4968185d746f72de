/**
 * Housekeeping of finished jobs: once their keep time is over, print jobs' rows and built files
 * (sheets and PNG zips under `print/` in the file store, the data directory or the bucket) and
 * odds runs' rows (their answers) are deleted.
 *
 * One process sweeps at a time: the sweep holds a PostgreSQL advisory lock and skips its turn
 * when another holds it. Built files are content-addressed, so a new job may finish onto a file
 * an old one left; finishing a job holds the same lock shared (`holdingJobFiles`), so a sweep
 * never deletes a file between a build finding it in place and its row naming it. (The embedded
 * database runs one transaction at a time, which keeps the two apart with no lock.)
 */
import { and, inArray, isNotNull, lt, sql } from 'drizzle-orm';
import { isEmbedded, type Db } from './db';
import { asBackground } from './db/turns';
import { oddsJobs, printJobs } from './db/schema';
import { storage } from './storage';
import { countSetting } from '../settings';

/** A finished job's row and file stay this long to be read. */
export const JOB_KEEP_MS = 10 * 60 * 1000;
/**
 * A job still open this long after it was queued is taken as lost (the queue gave up on it when
 * its last attempt's process died) and closed as failed, so whoever waits for it hears so.
 */
export const JOB_LOST_MS = 6 * 60 * 60 * 1000;
/** How often each process offers to sweep. */
const SWEEP_EVERY_MS = countSetting(process.env.PADDOCK_SWEEP_SECONDS, 60) * 1000;
/** The advisory lock's key (any fixed number, the same in every process). */
export const JOB_FILES_LOCK = 0x70616464_6f636b01n;

/** Where built job files live in the store. */
export const JOB_FILES_PREFIX = 'print/';

const lockKey = sql.raw(`${BigInt.asIntN(64, JOB_FILES_LOCK)}`);

/** Runs `work` (store a job's file, then record it on the row) so that no sweep runs meanwhile. */
export async function holdingJobFiles<T>(db: Db, work: (tx: Db) => Promise<T>): Promise<T> {
	return db.transaction(async (tx) => {
		if (!isEmbedded(db)) await tx.execute(sql`select pg_advisory_xact_lock_shared(${lockKey})`);
		return work(tx as unknown as Db);
	});
}

export interface Sweep {
	/** False when another process was sweeping (or a job was being finished): nothing done. */
	swept: boolean;
	/** Jobs closed as lost. */
	lost: number;
	rows: number;
	files: number;
}

/**
 * Closes jobs lost long ago, deletes what finished before `now - JOB_KEEP_MS`, and built files
 * no job row names.
 */
export async function sweepFinishedJobs(db: Db, now = new Date()): Promise<Sweep> {
	return db.transaction(async (tx) => {
		// Both drivers (PGlite, node-postgres) answer `{ rows }`.
		const lock = (await tx.execute(sql`select pg_try_advisory_xact_lock(${lockKey}) as got`)) as unknown as { rows: { got?: boolean }[] };
		if (!lock.rows[0]?.got) return { swept: false, lost: 0, rows: 0, files: 0 };
		const lostBefore = new Date(now.getTime() - JOB_LOST_MS);
		const lostPrints = await tx
			.update(printJobs)
			.set({ state: 'failed', error: { message: 'The build was lost; start it again' }, finishedAt: now })
			.where(and(inArray(printJobs.state, ['queued', 'running']), lt(printJobs.createdAt, lostBefore)))
			.returning({ id: printJobs.id });
		const lostOdds = await tx
			.update(oddsJobs)
			.set({ state: 'failed', error: 'The run was lost; start it again', finishedAt: now })
			.where(and(inArray(oddsJobs.state, ['queued', 'running']), lt(oddsJobs.createdAt, lostBefore)))
			.returning({ id: oddsJobs.id });
		const cutoff = new Date(now.getTime() - JOB_KEEP_MS);
		const prints = await tx.delete(printJobs).where(lt(printJobs.finishedAt, cutoff)).returning({ id: printJobs.id });
		const odds = await tx.delete(oddsJobs).where(lt(oddsJobs.finishedAt, cutoff)).returning({ id: oddsJobs.id });
		const named = new Set(
			(await tx.selectDistinct({ key: printJobs.fileKey }).from(printJobs).where(and(isNotNull(printJobs.fileKey)))).map((r) => r.key)
		);
		let files = 0;
		for (const key of await storage().list(JOB_FILES_PREFIX)) {
			if (named.has(key)) continue;
			await storage().remove(key);
			files++;
		}
		return { swept: true, lost: lostPrints.length + lostOdds.length, rows: prints.length + odds.length, files };
	});
}

/**
 * With the embedded database only this process runs jobs, so jobs still open at its start were
 * lost with the process before: closed as failed, so their owners hear so and they no longer
 * hold places in the bounded print queue.
 */
export async function closeJobsLeftOpen(db: Db, now = new Date()): Promise<number> {
	const prints = await db
		.update(printJobs)
		.set({ state: 'failed', error: { message: 'The build was lost in a restart; start it again' }, finishedAt: now })
		.where(inArray(printJobs.state, ['queued', 'running']))
		.returning({ id: printJobs.id });
	const odds = await db
		.update(oddsJobs)
		.set({ state: 'failed', error: 'The run was lost in a restart; start it again', finishedAt: now })
		.where(inArray(oddsJobs.state, ['queued', 'running']))
		.returning({ id: oddsJobs.id });
	return prints.length + odds.length;
}

/** Offers to sweep every minute (or PADDOCK_SWEEP_SECONDS); returns the stop. */
export function startSweeping(db: Db): () => void {
	let running: Promise<unknown> = Promise.resolve();
	const timer = setInterval(() => {
		running = asBackground(() => sweepFinishedJobs(db)).catch((e) => console.error(`Sweeping finished jobs: ${(e as Error).message}`));
	}, SWEEP_EVERY_MS);
	timer.unref();
	return () => {
		clearInterval(timer);
		void running;
	};
}
