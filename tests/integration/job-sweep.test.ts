/**
 * Finished jobs are swept after their keep time: print jobs' rows and built files (in the data
 * directory on the first pass, in the bucket on the second), odds runs' rows; files a kept job
 * still names stay, even when an old job named the same file. One process sweeps at a time:
 * with the lock held elsewhere (another process sweeping, or a job being finished) a sweep
 * does nothing (checked on the PostgreSQL pass, where another connection can hold it).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq, inArray, sql } from 'drizzle-orm';
import pg from 'pg';
import { openWorld, type World } from './harness';
import { oddsJobs, printJobs } from '$lib/server/db/schema';
import { storage } from '$lib/server/storage';
import { isEmbedded } from '$lib/server/db';
import { JOB_FILES_LOCK, JOB_KEEP_MS, JOB_LOST_MS, holdingJobFiles, sweepFinishedJobs } from '$lib/server/job-sweep';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

const MINUTE = 60_000;
const key = (n: number) => `print/0${n}/job-file-${n}.pdf`;
const ago = (ms: number) => new Date(Date.now() - ms);

async function printRow(fileKey: string | null, finishedAgo: number | null) {
	const [row] = await w.db
		.insert(printJobs)
		.values({
			userId: w.callers.designer!.id,
			gameId: w.gameId,
			request: {},
			fileName: 'sheets.pdf',
			fileKey,
			state: finishedAgo === null ? 'running' : 'done',
			finishedAt: finishedAgo === null ? null : ago(finishedAgo)
		})
		.returning();
	return row.id;
}

async function oddsRow(finishedAgo: number | null) {
	const [row] = await w.db
		.insert(oddsJobs)
		.values({
			userId: w.callers.designer!.id,
			gameId: w.gameId,
			request: {},
			state: finishedAgo === null ? 'running' : 'done',
			result: finishedAgo === null ? null : { kind: 'race' },
			finishedAt: finishedAgo === null ? null : ago(finishedAgo)
		})
		.returning();
	return row.id;
}

const bytes = (n: number) => new TextEncoder().encode(`%PDF-1.7 file ${n}`);

describe('sweeping finished jobs', () => {
	it('deletes rows and files past their keep time, and keeps what a kept job names', async () => {
		for (const n of [1, 2, 3, 4]) await storage().putOnce(key(n), bytes(n), 'application/pdf');
		const oldPrint = await printRow(key(1), JOB_KEEP_MS + MINUTE);
		const freshPrint = await printRow(key(2), MINUTE);
		// The same content-addressed file named by an old job and by a fresh one.
		const oldShared = await printRow(key(3), JOB_KEEP_MS + MINUTE);
		const freshShared = await printRow(key(3), MINUTE);
		const building = await printRow(null, null);
		// key(4): a file no row names (a build whose process died before recording it).
		const oldOdds = await oddsRow(JOB_KEEP_MS + MINUTE);
		const freshOdds = await oddsRow(MINUTE);
		const runningOdds = await oddsRow(null);

		const sweep = await sweepFinishedJobs(w.db);
		expect(sweep.swept).toBe(true);

		const prints = (await w.db.select({ id: printJobs.id }).from(printJobs).where(inArray(printJobs.id, [oldPrint, freshPrint, oldShared, freshShared, building]))).map((r) => r.id);
		expect(prints.sort()).toEqual([freshPrint, freshShared, building].sort());
		const odds = (await w.db.select({ id: oddsJobs.id }).from(oddsJobs).where(inArray(oddsJobs.id, [oldOdds, freshOdds, runningOdds]))).map((r) => r.id);
		expect(odds.sort()).toEqual([freshOdds, runningOdds].sort());

		expect(await storage().has(key(1))).toBe(false);
		expect(await storage().has(key(2))).toBe(true);
		expect(await storage().has(key(3))).toBe(true);
		expect(await storage().has(key(4))).toBe(false);
		expect(await storage().get(key(2))).toEqual(bytes(2));
		expect((await storage().list('print/')).sort()).toEqual([key(2), key(3)]);
	});

	it('sweeps the rest once the fresh jobs age past their keep time', async () => {
		const later = new Date(Date.now() + JOB_KEEP_MS + 2 * MINUTE);
		const sweep = await sweepFinishedJobs(w.db, later);
		expect(sweep.swept).toBe(true);
		expect(await storage().list('print/')).toEqual([]);
		// A job still running is not swept.
		expect((await w.db.select().from(printJobs).where(eq(printJobs.state, 'running'))).length).toBeGreaterThan(0);
	});

	it('while a job is being finished, a sweep waits its turn and the file stays', async () => {
		await storage().putOnce(key(5), bytes(5), 'application/pdf');
		const id = await printRow(null, null);
		// Finishing holds the lock shared; a sweep in the meantime (on one PGlite connection the
		// two simply take turns) must not delete the file the job is about to name.
		await holdingJobFiles(w.db, async (tx) => {
			await tx.update(printJobs).set({ state: 'done', fileKey: key(5), finishedAt: new Date() }).where(eq(printJobs.id, id));
		});
		await sweepFinishedJobs(w.db);
		expect(await storage().has(key(5))).toBe(true);
	});

	it('a job being finished holds the files lock on a database server; the embedded database, one transaction at a time, takes none', async () => {
		expect(isEmbedded(w.db)).toBe(!w.databaseUrl);
		// PostgreSQL's lock view (PostgreSQL documentation, "pg_locks"): this session's advisory locks.
		const held = await holdingJobFiles(w.db, async (tx) => {
			const res = (await tx.execute(sql`select count(*)::int as n from pg_locks where locktype = 'advisory' and pid = pg_backend_pid()`)) as unknown as { rows: { n: number }[] };
			return res.rows[0].n;
		});
		expect(held).toBe(w.databaseUrl ? 1 : 0);
	});

	it('closes a job still open long after it was queued as failed, so its waiter hears so, then sweeps it', async () => {
		const lostPrint = await printRow(null, null);
		const lostOdds = await oddsRow(null);
		const longAgo = ago(JOB_LOST_MS + MINUTE);
		await w.db.update(printJobs).set({ createdAt: longAgo }).where(eq(printJobs.id, lostPrint));
		await w.db.update(oddsJobs).set({ createdAt: longAgo }).where(eq(oddsJobs.id, lostOdds));
		const sweep = await sweepFinishedJobs(w.db);
		expect(sweep.lost).toBe(2);
		const [p] = await w.db.select().from(printJobs).where(eq(printJobs.id, lostPrint));
		expect(p.state).toBe('failed');
		expect(p.error?.message).toMatch(/lost; start it again/);
		const [o] = await w.db.select().from(oddsJobs).where(eq(oddsJobs.id, lostOdds));
		expect(o.state).toBe('failed');
		expect(o.error).toMatch(/lost; start it again/);
		// Kept for its ten minutes like any finished job, then swept.
		await sweepFinishedJobs(w.db, new Date(Date.now() + JOB_KEEP_MS + MINUTE));
		expect(await w.db.select().from(printJobs).where(eq(printJobs.id, lostPrint))).toEqual([]);
		expect(await w.db.select().from(oddsJobs).where(eq(oddsJobs.id, lostOdds))).toEqual([]);
	});

	const server = process.env.PADDOCK_TEST_DATABASE_URL;
	it.runIf(server)('one process at a time: with the lock held elsewhere a sweep does nothing', async () => {
		await storage().putOnce(key(6), bytes(6), 'application/pdf');
		const other = new pg.Client(w.databaseUrl);
		await other.connect();
		try {
			await other.query('begin');
			// Another process finishing a job (the shared hold) or sweeping (the exclusive one).
			await other.query(`select pg_advisory_xact_lock_shared(${BigInt.asIntN(64, JOB_FILES_LOCK)})`);
			const sweep = await sweepFinishedJobs(w.db);
			expect(sweep).toEqual({ swept: false, lost: 0, rows: 0, files: 0 });
			expect(await storage().has(key(6))).toBe(true);
			await other.query('commit');
		} finally {
			await other.end();
		}
		expect((await sweepFinishedJobs(w.db)).swept).toBe(true);
		expect(await storage().has(key(6))).toBe(false);
	});
});
