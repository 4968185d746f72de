/**
 * Daily work without traps, against an in-memory database: a printer's preview of a released proof
 * shows its art, saves are not refused because of another object, and the other everyday checks.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openWorld, fakeEvent, type World, actorIn } from './harness';
import { applyChanges, loadGame } from '$lib/server/game-store';
import { Invalid } from '$lib/server/refusals';
import { savedNote } from '$lib/server/http/object-actions';
import * as runnersPage from '../../src/routes/(app)/games/[gameId=id]/runners/+page.server';
import * as artPage from '../../src/routes/(app)/games/[gameId=id]/art/+page.server';
import { renderGameFaces } from '$lib/print/job';
import { artBytes } from '$lib/server/printing';
import * as pressColour from '../../src/routes/api/v1/press-colour/+server';
import { cutProof, releaseProof } from '$lib/server/proofs';
import * as printPreview from '../../src/routes/api/v1/games/[gameId=id]/print-preview/+server';
import * as proofArt from '../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/art-files/[sha256]/+server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

const designer = () => ({ id: w.callers.designer!.id, name: w.callers.designer!.name });
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const ev = (who: keyof World['callers'], call: Parameters<typeof fakeEvent>[1]) => fakeEvent(w.callers[who], call) as any;

describe("a released proof's print preview", () => {
	it('links art through the proof, and the printer can fetch every linked file', async () => {
		const p = await cutProof(w.db, actorIn(w, 'designer'), { description: 'for the printer' });
		await releaseProof(w.db, actorIn(w, 'designer'), { proof: p });
		const game = await loadGame(w.db, w.gameId);
		// The kinds whose faces carry art (runner portraits reach movement cards).
		const kinds = game.kinds.map((k) => k.id).join(',');
		const res = await printPreview.GET(ev('printer', { params: { gameId: w.gameId }, path: `/?paper=a4&kinds=${kinds}&proof=${p.id}` }));
		expect(res.status).toBe(200);
		const { svg } = (await res.json()) as { svg: string };
		const links = [...svg.matchAll(/href="([^"]+\/art-files\/([0-9a-f]{64}))"/g)];
		expect(links.length).toBeGreaterThan(0);
		for (const [, href, sha256] of links) {
			expect(href).toContain(`/proofs/${p.number}/art-files/`);
			const art = await proofArt.GET(ev('printer', { params: { gameId: w.gameId, proofId: String(p.number), sha256 } }));
			expect(art.status).toBe(200);
		}
	});

	it('refuses art the proof does not hold', async () => {
		const p = await cutProof(w.db, actorIn(w, 'designer'), { description: 'no such art' });
		const res = await proofArt.GET(ev('designer', { params: { gameId: w.gameId, proofId: p.id, sha256: 'a'.repeat(64) } }));
		expect(res.status).toBe(404);
	});
});

describe('saving one object is never refused because of another', () => {
	it('a new runner saves although a table now lacks a place; the warning links to the table', async () => {
		let game = await loadGame(w.db, w.gameId);
		const field = game.runners.length;
		const rows = Array.from({ length: field }, (_, i) => ({ place: i + 1, coins: field - i }));
		await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'moneyTable', id: 'exact-fit', baseVersion: null, object: { id: 'exact-fit', name: 'Exact fit', rows } }], action: 'test' });
		game = await loadGame(w.db, w.gameId);
		const runner = { ...game.runners[0], id: 'late-entry', name: 'Late Entry', sortOrder: 50 };
		delete (runner as { version?: number }).version;
		const saved = await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'runner', id: runner.id, baseVersion: null, object: runner }], action: 'test' });
		expect((await loadGame(w.db, w.gameId)).runners.map((r) => r.id)).toContain('late-entry');
		const warning = saved.saveWarnings.find((x) => x.ref?.id === 'exact-fit');
		expect(warning?.message).toContain(`place ${field + 1} has no coins`);
		const note = savedNote(w.gameId, saved.saveWarnings);
		expect(note.tone).toBe('warning');
		expect(note.links?.map((l) => l.href)).toContain(`/games/${w.gameId}/money-tables?table=exact-fit`);
		// Saving the table itself with the gap is still refused: that is its own problem.
		const table = (await loadGame(w.db, w.gameId)).moneyTables.find((t) => t.id === 'exact-fit')!;
		await expect(
			applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'moneyTable', id: table.id, baseVersion: table.version!, object: { ...table, name: 'Renamed' } }], action: 'test' })
		).rejects.toThrow(Invalid);
	});

	it('a runner in use cannot be deleted and the answer says what uses it', async () => {
		const game = await loadGame(w.db, w.gameId);
		const used = game.runners.find((r) => game.cards.some((c) => 'runnerId' in c.data && c.data.runnerId === r.id))!;
		const res = await runnersPage.actions.delete(ev('designer', { params: { gameId: w.gameId }, form: { id: used.id, version: String(used.version) } }));
		expect(res).toMatchObject({ status: 409 });
		expect(JSON.stringify(res)).toMatch(/used by \d+ cards? of/);
	});
});

describe('new-runner defaults', () => {
	it('propose an unused symbol and order and a press colour converted from the screen colour', async () => {
		const game = await loadGame(w.db, w.gameId);
		const data = (await runnersPage.load(ev('designer', { params: { gameId: w.gameId }, path: '/?new' }))) as Awaited<ReturnType<typeof runnersPage.load>>;
		const blank = data.form.data;
		expect(game.runners.map((r) => r.symbol)).not.toContain(blank.symbol);
		expect(game.runners.map((r) => r.sortOrder)).not.toContain(blank.sortOrder);
		expect(blank.cmyk.c + blank.cmyk.m + blank.cmyk.y + blank.cmyk.k).toBeGreaterThan(0);
		expect(data.pressColourNote).toMatch(/approximation/);
		expect(data.pressColourNote).toMatch(/print shop/);
		// White paper needs no ink, black mostly K: the direction any press profile takes.
		const white = await (await pressColour.GET(ev('artist', { path: '/?hex=%23ffffff' }))).json();
		expect(white.cmyk).toEqual({ c: 0, m: 0, y: 0, k: 0 });
		const black = await (await pressColour.GET(ev('artist', { path: '/?hex=%23000000' }))).json();
		expect(black.cmyk.k).toBeGreaterThan(50);
		expect((await pressColour.GET(ev('artist', { path: '/?hex=red' }))).status).toBe(400);
	});
});

describe('the readiness list', () => {
	it('never blocks a proof, and the proof records it', async () => {
		// Earlier tests left a runner without wager cards and a table one place short.
		const p = await cutProof(w.db, actorIn(w, 'designer'), { description: 'with warnings' });
		const codes = p.readiness.map((r) => r.code);
		expect(codes).toEqual(expect.arrayContaining(['no-wager', 'table-gap']));
	});
});

describe('one figure for one thing', () => {
	it('the art page and the print build give the same dpi for each art piece', async () => {
		const game = await loadGame(w.db, w.gameId);
		const page = (await artPage.load(ev('artist', { params: { gameId: w.gameId }, path: '/' }))) as unknown as {
			art: { fileName: string; print: { dpi: number | null; ok: boolean; faces: number } }[];
		};
		const faces = await renderGameFaces(game, await artBytes(game));
		let compared = 0;
		for (const a of page.art.filter((x) => !x.print.ok && x.print.faces > 0)) {
			const said = faces.warnings.find((m) => m.includes(`“${a.fileName}” prints at`));
			expect(said, a.fileName).toBeDefined();
			expect(said).toContain(`prints at ${a.print.dpi} dpi`);
			compared++;
		}
		expect(compared).toBeGreaterThan(0);
	});
});
