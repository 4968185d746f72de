/**
 * A print job followed by its event stream (GET /api/v1/print-jobs/{id}/events): read with
 * eventsource-parser, an independent reader of the HTML standard's `text/event-stream` format.
 * The stream's states end as the job's own state (GET /api/v1/print-jobs/{id}) ends; the stream
 * ends with the job, or at its time limit with a `retry` for the browser; a change made in this
 * process arrives with its row, and a job changed elsewhere (another process) is seen by the
 * stream's own re-reads; nobody follows another's job; a stream
 * that ends leaves no follower behind.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { EventSourceParserStream } from 'eventsource-parser/stream';
import { openWorld, type World } from './harness';
import { as, g } from './role-table';
import { printJobs } from '$lib/server/db/schema';
import { failJob, jobFor, jobFollowers } from '$lib/server/print-jobs';
import { jobEventStream } from '$lib/server/http/job-events';
import * as queueApi from '../../src/routes/api/v1/games/[gameId=id]/print-jobs/+server';
import * as jobApi from '../../src/routes/api/v1/print-jobs/[jobId=id]/+server';
import * as eventsApi from '../../src/routes/api/v1/print-jobs/[jobId=id]/events/+server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

interface Read {
	states: { state: string; done: number; total: number }[];
	retry?: number;
}

/** Every event of a stream until it ends. */
async function readAll(res: Response): Promise<Read> {
	const out: Read = { states: [] };
	const events = res.body!.pipeThrough(new TextDecoderStream()).pipeThrough(new EventSourceParserStream({ onRetry: (ms) => (out.retry = ms) }));
	for await (const event of events) {
		expect(event.event).toBe('state');
		out.states.push(JSON.parse(event.data));
	}
	return out;
}

/** A job row nobody builds: it stays queued until the test changes it. */
async function idleJob(): Promise<string> {
	const [row] = await w.db
		.insert(printJobs)
		.values({ userId: w.callers.designer!.id, gameId: w.gameId, request: { type: 'sheets' }, requestSha256: null, fileName: 'idle.pdf' })
		.returning({ id: printJobs.id });
	return row.id;
}

describe('following a print job by its events', () => {
	it('streams its states until it is done, ending as the job itself answers', async () => {
		const queued = (await queueApi.POST(as(w, 'designer', { params: g(w), json: { query: { paper: 'a4', margin: '4.37' } } }))) as Response;
		expect(queued.status).toBe(202);
		const { id } = (await queued.json()) as { id: string };
		const res = (await eventsApi.GET(as(w, 'designer', { params: { jobId: id } }))) as Response;
		expect(res.status).toBe(200);
		// The format's media type (HTML Living Standard, server-sent events).
		expect(res.headers.get('content-type')).toMatch(/^text\/event-stream/);
		expect(res.headers.get('cache-control')).toBe('no-store');
		const { states, retry } = await readAll(res);
		expect(retry).toBeGreaterThan(0);
		expect(states.length).toBeGreaterThanOrEqual(1);
		// Each state differs from the one before: only changes are sent.
		for (let i = 1; i < states.length; i++) expect(states[i]).not.toEqual(states[i - 1]);
		// The last step is never written as progress: the finished row says it at once.
		for (const s of states.filter((s) => s.state === 'running')) expect(s.done).toBeLessThan(Math.max(s.total, 1));
		const last = states.at(-1)!;
		expect(last.state).toBe('done');
		const answered = (await (await jobApi.GET(as(w, 'designer', { params: { jobId: id } }))).json()) as unknown;
		expect(last).toEqual(answered);
		expect(jobFollowers(id)).toBe(0);
	}, 120_000);

	it('a finished job answers its last state once and ends', async () => {
		const id = await idleJob();
		await w.db.update(printJobs).set({ state: 'failed', error: { message: 'The build failed' }, finishedAt: new Date() }).where(eq(printJobs.id, id));
		const { states } = await readAll((await eventsApi.GET(as(w, 'designer', { params: { jobId: id } }))) as Response);
		expect(states.map((s) => s.state)).toEqual(['failed']);
		expect(jobFollowers(id)).toBe(0);
	});

	it('sees a change made by another process on its own re-read', async () => {
		const id = await idleJob();
		const first = await jobFor(w.db, w.callers.designer!.id, id);
		const res = jobEventStream(w.db, w.callers.designer!.id, first, new AbortController().signal, { checkMs: 50 });
		const reading = readAll(res);
		await new Promise((r) => setTimeout(r, 120));
		// Written straight to the row, as another process would: no change is heard here.
		await w.db.update(printJobs).set({ state: 'running', done: 2, total: 9 }).where(eq(printJobs.id, id));
		await new Promise((r) => setTimeout(r, 120));
		await w.db.update(printJobs).set({ state: 'done', done: 9, total: 9, fileKey: 'print/none.pdf', finishedAt: new Date() }).where(eq(printJobs.id, id));
		const { states } = await reading;
		expect(states.map((s) => [s.state, s.done, s.total])).toEqual([
			['queued', 0, 0],
			['running', 2, 9],
			['done', 9, 9]
		]);
	});

	it('hears a change made in this process with no read of its own', async () => {
		const id = await idleJob();
		const first = await jobFor(w.db, w.callers.designer!.id, id);
		// Re-reads an hour apart: only the row handed over with the change can end this stream.
		const reading = readAll(jobEventStream(w.db, w.callers.designer!.id, first, new AbortController().signal, { checkMs: 3_600_000 }));
		await new Promise((r) => setTimeout(r, 50));
		await failJob(w.db, id, 'Stopped by the test');
		const { states } = await reading;
		expect(states.map((s) => s.state)).toEqual(['queued', 'failed']);
		expect(jobFollowers(id)).toBe(0);
	});

	it('ends unfinished at its time limit, telling the browser when to connect again', async () => {
		const id = await idleJob();
		const first = await jobFor(w.db, w.callers.designer!.id, id);
		const t = performance.now();
		const { states, retry } = await readAll(jobEventStream(w.db, w.callers.designer!.id, first, new AbortController().signal, { streamMs: 150 }));
		expect(performance.now() - t).toBeGreaterThanOrEqual(140);
		expect(states.map((s) => s.state)).toEqual(['queued']);
		expect(retry).toBeGreaterThan(0);
		expect(jobFollowers(id)).toBe(0);
	});

	it('leaves no follower behind when the client goes away', async () => {
		const id = await idleJob();
		const first = await jobFor(w.db, w.callers.designer!.id, id);
		const gone = new AbortController();
		const res = jobEventStream(w.db, w.callers.designer!.id, first, gone.signal);
		const reader = res.body!.getReader();
		await reader.read();
		expect(jobFollowers(id)).toBe(1);
		await reader.cancel();
		expect(jobFollowers(id)).toBe(0);
		// The same when the request is aborted rather than the body cancelled.
		const again = jobEventStream(w.db, w.callers.designer!.id, first, gone.signal);
		expect(jobFollowers(id)).toBe(1);
		gone.abort();
		expect(jobFollowers(id)).toBe(0);
		await again.body!.cancel();
	});

	it("another person's job is not found, and a stranger is asked to sign in", async () => {
		const id = await idleJob();
		const other = (await eventsApi.GET(as(w, 'reviewer', { params: { jobId: id } }))) as Response;
		expect(other.status).toBe(404);
		expect(((await other.json()) as { error: { code: string } }).error.code).toBe('not_found');
		const stranger = (await eventsApi.GET(as(w, 'anonymous', { params: { jobId: id } }))) as Response;
		expect(stranger.status).toBe(401);
	});
});
