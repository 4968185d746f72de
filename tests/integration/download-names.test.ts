/**
 * What the print page and the downloads tell people: one page count for one build (the preview,
 * the finished job and poppler's pdfinfo, an independent reader, agree), and file names that say
 * the game, the version, the day and what is inside (never an internal id).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { writeFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openWorld, type World } from './harness';
import { as, g } from './role-table';
import { loadGame } from '$lib/server/game-store';
import * as previewApi from '../../src/routes/api/v1/games/[gameId=id]/print-preview/+server';
import * as queueApi from '../../src/routes/api/v1/games/[gameId=id]/print-jobs/+server';
import * as jobApi from '../../src/routes/api/v1/print-jobs/[jobId=id]/+server';
import * as fileApi from '../../src/routes/api/v1/print-jobs/[jobId=id]/file/+server';
import * as proofPressApi from '../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/cards/[cardId]/press.pdf/+server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

function pdfPages(bytes: Uint8Array): number {
	const file = join(mkdtempSync(join(tmpdir(), 'paddock-names-')), 'file.pdf');
	writeFileSync(file, bytes);
	return Number(/^Pages:\s+(\d+)/m.exec(execFileSync('pdfinfo', [file], { encoding: 'utf8' }))![1]);
}

async function waitDone(id: string) {
	for (let i = 0; i < 600; i++) {
		const res = (await jobApi.GET(as(w, 'designer', { params: { jobId: id } }))) as Response;
		const state = (await res.json()) as { state: string; pages?: number; guidePages?: number };
		if (state.state === 'done' || state.state === 'failed') return state;
		await new Promise((ok) => setTimeout(ok, 250));
	}
	throw new Error('the job did not finish');
}

const attachmentName = (res: Response) => /filename="([^"]+)"/.exec(res.headers.get('content-disposition') ?? '')?.[1];

describe('one page count', () => {
	it('the preview, the finished job and pdfinfo count the same pages, the cutting guide named', async () => {
		const kind = (await loadGame(w.db, w.gameId)).kinds[0].id;
		const query = { paper: 'a4', kinds: kind };
		const preview = (await (
			(await previewApi.GET(as(w, 'designer', { params: g(w), path: `/api/v1/games/${w.gameId}/print-preview?${new URLSearchParams(query)}` }))) as Response
		).json()) as { pages: number; guidePages: number; sheets: number };
		const queued = (await queueApi.POST(as(w, 'designer', { params: g(w), json: { query } }))) as Response;
		const job = (await queued.json()) as { id: string };
		const done = await waitDone(job.id);
		expect(done.state).toBe('done');
		const file = (await fileApi.GET(as(w, 'designer', { params: { jobId: job.id } }))) as Response;
		const pages = pdfPages(new Uint8Array(await file.arrayBuffer()));
		expect(preview.pages).toBe(pages);
		expect(done.pages).toBe(pages);
		// The cutting guide is on by default: one page of it, counted in both.
		expect(preview.guidePages).toBe(1);
		expect(done.guidePages).toBe(1);
		expect(attachmentName(file)).toMatch(/^the-marrowbed-derby_working-copy-v\d+_\d{4}-\d{2}-\d{2}_sheets-a4\.pdf$/);
	});
});

describe('download names', () => {
	it("a proof's press file is named from the game, the proof, its day, the kind and the card", async () => {
		const game = await loadGame(w.db, w.gameId);
		const card = game.cards.find((c) => c.kindId === 'kd-hazard')!;
		const res = (await proofPressApi.GET(as(w, 'printer', { params: { gameId: w.gameId, proofId: '1', cardId: card.id } }))) as Response;
		expect(res.status).toBe(200);
		const name = attachmentName(res)!;
		expect(name).toMatch(/^the-marrowbed-derby_proof-1_\d{4}-\d{2}-\d{2}_garden-hazards_[a-z0-9-]+\.pdf$/);
		expect(name).toContain(card.name.toLowerCase().replace(/[^a-z0-9]+/g, '-'));
		expect(name).not.toContain(card.id);
	});
});
