/**
 * Sheet builds and PNG zips started from the print page, as jobs any app process can follow. The job's state
 * is a database row and its file is in the file store, so whichever process built it, every
 * process answers its progress and serves its file. Where it runs is the job queue's business
 * (./job-queue.ts): the process's own worker pool, or a PostgreSQL-backed queue shared by all.
 *
 * A job is built from what was fixed when it was queued (the game as data, the options, the
 * date), in isolation from any worker cache, so a retry after a crash makes the same bytes; and
 * only the first build to finish is recorded, so a job never ends with two different files.
 */
import { AsyncResource } from 'node:async_hooks';
import { createHash } from 'node:crypto';
import { EventEmitter } from 'node:events';
import { and, desc, eq, getTableColumns, gt, isNotNull, ne, sql } from 'drizzle-orm';
import type { Db } from './db';
import { printJobs } from './db/schema';
import { Conflict, NotFound, Refusal } from './refusals';
import { artBytes, buildPngZip, sheetsName, pngZipName, runPrint, type PngJobOptions, type PrintSource } from './printing';
import { storage, StorageUnavailableError, type StoredFile } from './storage';
import { jobQueue } from './job-queue';
import { holdingJobFiles, JOB_KEEP_MS } from './job-sweep';
import { admitPrintJob, noteBuildSeconds } from './job-admission';
import type { Game } from '$lib/game/model';
import type { GamePdfOptions } from '$lib/print/sheet-job';
import type { ApiAnswer, PrintJobSchema } from '$lib/schemas/api';

/**
 * A job as followed and downloaded: its row without the request (the whole game as data), which
 * only the build reads; a poll every few hundred ms must not fetch and parse the game.
 */
const { request: _request, requestSha256: _requestSha256, ...FOLLOWED } = getTableColumns(printJobs);
export type PrintJobRow = Omit<typeof printJobs.$inferSelect, 'request' | 'requestSha256'>;

interface SheetRequest {
	type: 'sheets';
	/** A proof's files must come out the same every time. */
	proof: boolean;
	game: Game;
	options: Omit<GamePdfOptions, 'onProgress'>;
}

/** One PNG per face in a zip (./printing.ts `buildPngZip`). */
interface PngRequest {
	type: 'pngs';
	proof: boolean;
	game: Game;
	options: PngJobOptions;
}

/**
 * Jobs whose row this process has just changed, by id, with the row as written: whoever follows
 * a job here (the events route) sends it at once, with no read of its own. A job built by another
 * process is not heard of here; followers read it again every so often for that.
 */
const changes = new EventEmitter().setMaxListeners(0);

/**
 * Calls `listener` with the job's row after each change this process makes to it; returns the way
 * to stop. The listener runs as part of the caller's work (a person's request), not the build's
 * background.
 */
export function onJobChange(id: string, listener: (row: PrintJobRow) => void): () => void {
	const bound = AsyncResource.bind(listener);
	changes.on(id, bound);
	return () => void changes.off(id, bound);
}

/** Followers of a job in this process now. */
export const jobFollowers = (id: string) => changes.listenerCount(id);

/** Tells this process's followers of the job its row as just written (none when no row was changed). */
const changed = (row: PrintJobRow | undefined) => void (row && changes.emit(row.id, row));

/** Progress is written at most this often, and not before the build has run this long. */
const PROGRESS_MS = 1_000;

/** Queues a sheet build and returns at once; progress is read with `jobFor` and `jobState`. */
export async function startSheetJob(db: Db, source: PrintSource, options: GamePdfOptions): Promise<PrintJobRow> {
	const { onProgress: _ignored, ...plain } = options;
	return queueJob(db, source, { type: 'sheets', proof: !!source.proofNumber, game: source.game, options: plain }, sheetsName(source, options));
}

/** Queues a PNG zip, followed like a sheet build. */
export async function startPngJob(db: Db, source: PrintSource, options: PngJobOptions): Promise<PrintJobRow> {
	return queueJob(db, source, { type: 'pngs', proof: !!source.proofNumber, game: source.game, options }, pngZipName(source, options.dpi));
}

async function queueJob(db: Db, source: PrintSource, request: SheetRequest | PngRequest, fileName: string): Promise<PrintJobRow> {
	// The request is the whole game as data: compared by its hash, an indexed column, not as JSON.
	// Its keys come in one order (the game read in position order, the options as their schema parsed them).
	const requestSha256 = createHash('sha256').update(JSON.stringify(request)).digest('hex');
	// One transaction, under the sweep's shared lock (so a twin's file cannot go between finding
	// and naming it): a twin finished a moment ago answers at once; otherwise the queue admits the
	// job, or refuses it now (503) with nothing written, rather than as a failed job later.
	const { row, queued } = await holdingJobFiles(db, async (tx) => {
		const twin = await finishedTwin(tx, source, requestSha256, fileName);
		if (twin) return { row: twin, queued: false };
		const inserted = await admitPrintJob(tx, async () => {
			const [job] = await tx
				.insert(printJobs)
				.values({ userId: source.actor.userId, gameId: source.gameId, request: request as unknown as Record<string, unknown>, requestSha256, fileName })
				.returning(FOLLOWED);
			return job;
		});
		return { row: inserted, queued: true };
	});
	if (queued) await jobQueue().send('print', row.id);
	return row;
}

/**
 * The same request built a moment ago (the game as data and the options alike, so the same file):
 * a new job, already done, on that file. A second download of a proof's sheets or PNGs is then
 * at once. Run inside `holdingJobFiles`.
 */
async function finishedTwin(tx: Db, source: PrintSource, requestSha256: string, fileName: string): Promise<PrintJobRow | null> {
	const [done] = await tx
		.select()
		.from(printJobs)
		.where(
			and(
				eq(printJobs.gameId, source.gameId),
				eq(printJobs.requestSha256, requestSha256),
				eq(printJobs.state, 'done'),
				isNotNull(printJobs.fileKey),
				gt(printJobs.finishedAt, new Date(Date.now() - JOB_KEEP_MS))
			)
		)
		.orderBy(desc(printJobs.finishedAt))
		.limit(1);
	if (!done) return null;
	const [row] = await tx
		.insert(printJobs)
		.values({
			userId: source.actor.userId,
			gameId: source.gameId,
			request: done.request,
			requestSha256,
			fileName,
			fileKey: done.fileKey,
			state: 'done',
			done: done.done,
			total: done.total,
			result: done.result,
			finishedAt: new Date()
		})
		.returning(FOLLOWED);
	return row;
}

export async function jobFor(db: Db, userId: string, id: string): Promise<PrintJobRow> {
	const [job] = await db
		.select(FOLLOWED)
		.from(printJobs)
		.where(and(eq(printJobs.id, id), eq(printJobs.userId, userId)));
	if (!job) throw new NotFound('No such print job (finished files are kept for ten minutes)');
	return job;
}

export function jobState(job: PrintJobRow): ApiAnswer<typeof PrintJobSchema> {
	return {
		id: job.id,
		state: job.state,
		done: job.done,
		total: job.total,
		error: job.error?.message,
		sheets: job.result?.sheets,
		pages: job.result?.pages,
		guidePages: job.result?.guidePages,
		bytes: job.result?.bytes,
		warnings: job.result?.warnings ?? []
	};
}

/** The finished file, opened in the store to be streamed. */
export async function jobFile(job: PrintJobRow): Promise<{ file: StoredFile; fileName: string; warnings: string[] }> {
	if (job.state === 'failed') {
		const reason = job.error?.reason;
		if (reason) throw new Refusal(reason, job.error?.message ?? 'The build failed');
		throw new Error(job.error?.message ?? 'The build failed');
	}
	if (job.state !== 'done' || !job.fileKey) throw new Conflict('The file is not ready yet');
	return { file: await storage().open(job.fileKey), fileName: job.fileName, warnings: job.result?.warnings ?? [] };
}

/**
 * Builds one queued job (called by the queue's worker, in whichever process took it). Returns
 * normally when the job is finished, failed for good (bad options) or was finished by another
 * build; throws when it should be tried again.
 */
export async function buildQueuedJob(db: Db, id: string): Promise<void> {
	const [job] = await db
		.update(printJobs)
		.set({ state: 'running', attempts: sql`${printJobs.attempts} + 1` })
		.where(and(eq(printJobs.id, id), ne(printJobs.state, 'done'), ne(printJobs.state, 'failed')))
		.returning();
	if (!job) return;
	changed(job);
	// Which process builds what, for operators following a shared queue.
	if (jobQueue().shared) console.log(`Building print job ${id} (attempt ${job.attempts}) in process ${process.pid}`);
	const request = job.request as unknown as SheetRequest | PngRequest;
	// The first write comes a second into the build, so a short build writes none; the last
	// step is never written, since the finished row says it at once.
	let last = Date.now();
	let writing = Promise.resolve();
	const progress = (done: number, total: number) => {
		const now = Date.now();
		if (done >= total || now - last < PROGRESS_MS) return;
		last = now;
		writing = writing
			.then(() => db.update(printJobs).set({ done, total }).where(and(eq(printJobs.id, id), eq(printJobs.state, 'running'))).returning(FOLLOWED))
			.then(([row]) => changed(row), () => undefined);
	};
	const started = performance.now();
	try {
		const art = await artBytes(request.game);
		// Isolated from the worker's cache when the bytes must not depend on what ran before: a
		// proof, or a shared queue where a retry elsewhere must make the very same file.
		const isolated = request.proof || jobQueue().shared;
		const result =
			request.type === 'pngs'
				? await buildPngZip(request.game, art, { ...request.options, isolated, admitted: true }, progress)
				: await runPrint({ type: 'sheets', isolated, game: request.game, art, options: request.options }, progress, { admitted: true });
		noteBuildSeconds((performance.now() - started) / 1000);
		// Hashed on the thread pool, not the server's own thread: a PNG zip runs to tens of MB.
		const sha256 = Buffer.from(await crypto.subtle.digest('SHA-256', result.bytes as Uint8Array<ArrayBuffer>)).toString('hex');
		const [extension, type] = request.type === 'pngs' ? ['zip', 'application/zip'] : ['pdf', 'application/pdf'];
		const fileKey = `print/${sha256.slice(0, 2)}/${sha256}.${extension}`;
		await writing;
		// Written before the database's turn is taken, since writing is the slow part. A sweep in
		// between may take away a file no row names yet: the second write, under the sweep's lock,
		// puts it back, and otherwise only finds it there.
		await storage()
			.putOnce(fileKey, result.bytes, type)
			.catch(() => undefined);
		// Stored and recorded with no sweep in between (./job-sweep.ts): the key may name a file an
		// older job left. The first build to get here wins; any other keeps its hands off the row.
		const [finished] = await holdingJobFiles(db, async (tx) => {
			await storage().putOnce(fileKey, result.bytes, type);
			return tx
				.update(printJobs)
				.set({
					state: 'done',
					fileKey,
					done: Math.max(result.pages ?? result.files ?? 1, 1),
					total: Math.max(result.pages ?? result.files ?? 1, 1),
					result: { sheets: result.sheets, pages: result.pages, guidePages: result.guidePages, bytes: result.bytes.byteLength, warnings: result.warnings },
					finishedAt: new Date()
				})
				.where(and(eq(printJobs.id, id), ne(printJobs.state, 'done')))
				.returning(FOLLOWED);
		});
		changed(finished);
	} catch (e) {
		await writing;
		// A refusal (bad options, a missing card) fails for good; a busy store is tried again.
		if (e instanceof Refusal && e.reason !== 'busy') {
			const [failed] = await db
				.update(printJobs)
				.set({ state: 'failed', error: { reason: e.reason, message: e.message }, finishedAt: new Date() })
				.where(and(eq(printJobs.id, id), ne(printJobs.state, 'done')))
				.returning(FOLLOWED);
			changed(failed);
			return;
		}
		if (!(e instanceof StorageUnavailableError)) console.error(e);
		throw e;
	}
}

/** Gives up on a job after its last attempt. */
export async function failJob(db: Db, id: string, message = 'The build failed') {
	const [failed] = await db
		.update(printJobs)
		.set({ state: 'failed', error: { message }, finishedAt: new Date() })
		.where(and(eq(printJobs.id, id), ne(printJobs.state, 'done')))
		.returning(FOLLOWED);
	changed(failed);
}
