/**
 * Print jobs as rows and stored files: a job queued through the API is built, its progress and
 * file are read back through the API (the file checked by poppler's pdfinfo, an independent
 * reader); a job is someone's own; two builds of one job (a retry racing a build thought lost)
 * record one file. On PGlite the job runs in this process; in the second pass through pg-boss.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { writeFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { openWorld, type World } from './harness';
import { as, g } from './role-table';
import { printJobs } from '$lib/server/db/schema';
import { buildQueuedJob } from '$lib/server/print-jobs';
import { artBytes, buildPngZip } from '$lib/server/printing';
import { storage, useStorage } from '$lib/server/storage';
import { loadGame } from '$lib/server/game-store';
import * as queueApi from '../../src/routes/api/v1/games/[gameId=id]/print-jobs/+server';
import * as jobApi from '../../src/routes/api/v1/print-jobs/[jobId=id]/+server';
import * as fileApi from '../../src/routes/api/v1/print-jobs/[jobId=id]/file/+server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

async function queue(query: Record<string, string>, proof?: string) {
	const res = (await queueApi.POST(as(w, 'designer', { params: g(w), json: { query, ...(proof ? { proof } : {}) } }))) as Response;
	expect(res.status).toBe(202);
	return (await res.json()) as { id: string; state: string };
}

async function waitDone(id: string) {
	for (let i = 0; i < 2400; i++) {
		const res = (await jobApi.GET(as(w, 'designer', { params: { jobId: id } }))) as Response;
		const state = (await res.json()) as { state: string; pages?: number; error?: string };
		if (state.state === 'done' || state.state === 'failed') return state;
		await new Promise((ok) => setTimeout(ok, 250));
	}
	throw new Error('the job did not finish');
}

function pdfPages(bytes: Uint8Array): number {
	const file = join(mkdtempSync(join(tmpdir(), 'paddock-job-')), 'sheets.pdf');
	writeFileSync(file, bytes);
	const info = execFileSync('pdfinfo', [file], { encoding: 'utf8' });
	return Number(/^Pages:\s+(\d+)/m.exec(info)![1]);
}

describe('a queued sheet build', () => {
	let kind: string;
	beforeAll(async () => {
		kind = (await loadGame(w.db, w.gameId)).kinds[0].id;
	});

	it('is built, followed and downloaded; only its owner sees it', async () => {
		const job = await queue({ paper: 'a4', kinds: kind });
		const done = await waitDone(job.id);
		expect(done.state).toBe('done');
		const file = (await fileApi.GET(as(w, 'designer', { params: { jobId: job.id } }))) as Response;
		expect(file.status).toBe(200);
		expect(file.headers.get('content-type')).toBe('application/pdf');
		const bytes = new Uint8Array(await file.arrayBuffer());
		expect(Number(file.headers.get('content-length'))).toBe(bytes.byteLength);
		// poppler counts the pages the job reported.
		expect(pdfPages(bytes)).toBe(done.pages);
		const other = (await jobApi.GET(as(w, 'reviewer', { params: { jobId: job.id } }))) as Response;
		expect(other.status).toBe(404);
	});

	it('built twice at once (a retry racing a build thought lost) records one file', async () => {
		const job = await queue({ paper: 'a4', kinds: kind }, '1');
		await waitDone(job.id);
		const [first] = await w.db.select().from(printJobs).where(eq(printJobs.id, job.id));
		// As if its process had died mid-build: back to running, then two builds race.
		await w.db.update(printJobs).set({ state: 'running', fileKey: null }).where(eq(printJobs.id, job.id));
		await Promise.all([buildQueuedJob(w.db, job.id), buildQueuedJob(w.db, job.id)]);
		const [after] = await w.db.select().from(printJobs).where(eq(printJobs.id, job.id));
		expect(after.state).toBe('done');
		// A proof's build is isolated: every build makes the same bytes, so the same content key.
		expect(after.fileKey).toBe(first.fileKey);
		const stored = (await storage().list('print/')).filter((k) => k === first.fileKey);
		expect(stored).toEqual([first.fileKey]);
	});

	it('a file swept away between its write and its record is written again under the lock', async () => {
		const real = storage();
		let taken = 0;
		// As if a sweep ran right after the first write: the file is there for a moment, then gone.
		const sweptOnce = new Proxy(real, {
			get(target, name) {
				if (name === 'putOnce')
					return async (key: string, bytes: Uint8Array, type: string) => {
						await target.putOnce(key, bytes, type);
						if (key.startsWith('print/') && taken++ === 0) await target.remove(key);
					};
				const value = Reflect.get(target, name);
				return typeof value === 'function' ? value.bind(target) : value;
			}
		});
		useStorage(sweptOnce);
		try {
			const job = await queue({ paper: 'a4', kinds: kind, margin: '4.91' });
			const done = await waitDone(job.id);
			expect(done.state).toBe('done');
			expect(taken).toBe(2);
			const file = (await fileApi.GET(as(w, 'designer', { params: { jobId: job.id } }))) as Response;
			expect(file.status).toBe(200);
			// poppler reads the file that was put back.
			expect(pdfPages(new Uint8Array(await file.arrayBuffer()))).toBe(done.pages);
		} finally {
			useStorage(real);
		}
	});

	it('bad options fail the job for good with the reason, no retry', async () => {
		const res = (await queueApi.POST(as(w, 'designer', { params: g(w), json: { query: { paper: 'a4', kinds: 'no-such-kind' } } }))) as Response;
		if (res.status === 400) return; // refused before queueing: fine too
		const job = (await res.json()) as { id: string };
		const done = await waitDone(job.id);
		expect(done.state).toBe('failed');
		expect(done.error).toBeTruthy();
	});
});

describe('a PNG zip', () => {
	let kind: string;
	beforeAll(async () => {
		kind = (await loadGame(w.db, w.gameId)).kinds[0].id;
	});

	async function queuePngs(proof: string) {
		const res = (await queueApi.POST(as(w, 'designer', { params: g(w), json: { kind: 'pngs', proof, query: { kinds: kind } } }))) as Response;
		expect(res.status).toBe(202);
		return (await res.json()) as { id: string; state: string; done: number; total: number };
	}

	it('asked for again while the first is kept is done at once, on the same file', async () => {
		const first = await queuePngs('1');
		expect((await waitDone(first.id)).state).toBe('done');
		const again = await queuePngs('1');
		// Answered done in the queueing reply itself: nothing is built a second time.
		expect(again.state).toBe('done');
		expect(again.done).toBe(again.total);
		const rows = await w.db.select().from(printJobs).where(eq(printJobs.gameId, w.gameId));
		const key = (id: string) => rows.find((r) => r.id === id)!.fileKey;
		expect(key(again.id)).toBe(key(first.id));
		const a = new Uint8Array(await ((await fileApi.GET(as(w, 'designer', { params: { jobId: first.id } }))) as Response).arrayBuffer());
		const b = new Uint8Array(await ((await fileApi.GET(as(w, 'designer', { params: { jobId: again.id } }))) as Response).arrayBuffer());
		expect(b).toEqual(a);
		// Anything else asked (another resolution) is built, not answered from that file.
		const res = (await queueApi.POST(as(w, 'designer', { params: g(w), json: { kind: 'pngs', proof: '1', query: { kinds: kind, dpi: '150' } } }))) as Response;
		expect(res.status).toBe(202);
		const other = (await res.json()) as { id: string; state: string };
		expect(other.state).toBe('queued');
		expect((await waitDone(other.id)).state).toBe('done');
	}, 600_000);

	it('reports one total from its first progress to its last, so the bar never moves back', async () => {
		const game = await loadGame(w.db, w.gameId);
		const totals = new Set<number>();
		let lastDone = 0;
		await buildPngZip(game, await artBytes(game), { dpi: 300, kinds: [kind], isolated: true }, (done, total) => {
			totals.add(total);
			expect(done).toBeGreaterThanOrEqual(lastDone);
			lastDone = done;
		});
		expect(totals.size).toBe(1);
	}, 600_000);
});
