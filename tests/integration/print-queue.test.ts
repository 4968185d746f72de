/**
 * The bounded print queue: past PADDOCK_PRINT_QUEUE_MAX jobs waiting or running, a new build is
 * answered 503 with a Retry-After in seconds (RFC 9110 §10.2.3: a delay-seconds value) and a JSON
 * error, and no row is written; once a job finishes, a new one is taken. The count is of database
 * rows, so jobs of another process (a row written by it) count too. On PGlite here; on
 * PostgreSQL with pg-boss in the second pass (`node scripts/test-server.js`).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count, eq } from 'drizzle-orm';
import { openWorld, type World } from './harness';
import { as, g } from './role-table';
import { printJobs } from '$lib/server/db/schema';
import { jobQueue, useJobQueue, type JobQueue } from '$lib/server/job-queue';
import { loadGame } from '$lib/server/game-store';
import * as queueApi from '../../src/routes/api/v1/games/[gameId=id]/print-jobs/+server';
import * as jobApi from '../../src/routes/api/v1/print-jobs/[jobId=id]/+server';

let w: World;
let real: JobQueue;
/** Jobs sent while the queue is held: they stay queued until handed to the real queue. */
const held: string[] = [];
let kind: string;

beforeAll(async () => {
	w = await openWorld();
	real = jobQueue();
	useJobQueue({ shared: real.shared, send: async (_name, id) => void held.push(id), stop: async () => {} });
	process.env.PADDOCK_PRINT_QUEUE_MAX = '2';
	kind = (await loadGame(w.db, w.gameId)).kinds[0].id;
});
afterAll(async () => {
	delete process.env.PADDOCK_PRINT_QUEUE_MAX;
	if (real) useJobQueue(real);
	await w?.close();
});

/** Each build asks for another margin, so none is answered from an identical finished one. */
let asked = 0;
const post = () =>
	queueApi.POST(as(w, 'designer', { params: g(w), json: { query: { paper: 'a4', kinds: kind, margin: (3 + ++asked / 10).toFixed(1) } } })) as Promise<Response>;
const rows = async () => (await w.db.select({ n: count() }).from(printJobs))[0].n;

async function waitDone(id: string) {
	for (let i = 0; i < 1200; i++) {
		const res = (await jobApi.GET(as(w, 'designer', { params: { jobId: id } }))) as Response;
		const state = (await res.json()) as { state: string };
		if (state.state === 'done' || state.state === 'failed') return state.state;
		await new Promise((ok) => setTimeout(ok, 250));
	}
	throw new Error('the job did not finish');
}

describe('the print queue, bounded', () => {
	it('refuses a build past the bound with 503 and Retry-After, writing nothing', async () => {
		expect((await post()).status).toBe(202);
		expect((await post()).status).toBe(202);
		const before = await rows();
		const refused = await post();
		expect(refused.status).toBe(503);
		const retry = refused.headers.get('retry-after');
		expect(retry).toMatch(/^\d+$/);
		expect(Number(retry)).toBeGreaterThanOrEqual(1);
		const body = (await refused.json()) as { error: { code: string; message: string } };
		expect(body.error.code).toBe('busy');
		expect(body.error.message).toMatch(/print queue is full/i);
		// Not half-made: no row, nothing sent to the queue.
		expect(await rows()).toBe(before);
		expect(held).toHaveLength(2);
	});

	it('takes a new build once one has finished', async () => {
		const first = held.shift()!;
		await real.send('print', first);
		expect(await waitDone(first)).toBe('done');
		const res = await post();
		expect(res.status).toBe(202);
		expect(held).toHaveLength(2);
	});

	it("counts another process's jobs (rows) and admits no more than the bound when builds arrive together", async () => {
		// Hand the held jobs over and let them finish: the queue is empty again.
		for (const id of held.splice(0)) {
			await real.send('print', id);
			await waitDone(id);
		}
		const [job] = await w.db.select().from(printJobs).limit(1);
		// A build running in another process: its row is all this one sees of it.
		const [other] = await w.db
			.insert(printJobs)
			.values({ userId: job.userId, gameId: job.gameId, request: job.request, fileName: job.fileName, state: 'running' })
			.returning();
		const answers = await Promise.all(Array.from({ length: 4 }, post));
		expect(answers.map((r) => r.status).sort()).toEqual([202, 503, 503, 503]);
		for (const r of answers.filter((a) => a.status === 503)) expect(r.headers.get('retry-after')).toMatch(/^\d+$/);
		await w.db.update(printJobs).set({ state: 'failed', finishedAt: new Date() }).where(eq(printJobs.id, other.id));
		for (const id of held.splice(0)) {
			await real.send('print', id);
			await waitDone(id);
		}
	});
});
