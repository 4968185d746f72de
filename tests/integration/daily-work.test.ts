/**
 * Daily work without traps, against an in-memory database: a printer's preview of a released proof
 * shows its art, saves are not refused because of another object, and the other everyday checks.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openWorld, fakeEvent, type World } from './harness';
import { loadGame } from '$lib/server/game-store';
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
		const p = await cutProof(w.db, { gameId: w.gameId, userId: designer().id, userName: 'Dara', description: 'for the printer' });
		await releaseProof(w.db, p, designer());
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
		const p = await cutProof(w.db, { gameId: w.gameId, userId: designer().id, userName: 'Dara', description: 'no such art' });
		const res = await proofArt.GET(ev('designer', { params: { gameId: w.gameId, proofId: p.id, sha256: 'a'.repeat(64) } }));
		expect(res.status).toBe(404);
	});
});
