/** Comparing two proofs: the fields that changed inside a card and the pixel difference of its faces. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openWorld, fakeEvent, type World, type Who, actorIn } from './harness';
import { applyChanges, loadGame } from '$lib/server/game-store';
import { cutProof } from '$lib/server/proofs';
import * as diffApi from '../../src/routes/api/v1/games/[gameId=id]/proofs/compare/diff.png/+server';
import * as compareApi from '../../src/routes/api/v1/games/[gameId=id]/proofs/compare/+server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const ev = (who: Who, path: string) => fakeEvent(w.callers[who], { params: { gameId: w.gameId }, path }) as any;
const cut = () => cutProof(w.db, actorIn(w, 'designer'), { description: 'compare' });

describe('comparing two proofs inside a card', () => {
	it('names the changed field and marks the changed pixels; an unchanged card differs by none', async () => {
		const a = await cut();
		const game = await loadGame(w.db, w.gameId);
		const card = game.cards.find((c) => c.data.type === 'movement')!;
		const other = game.cards.find((c) => c.kindId !== card.kindId && c.data.type !== 'movement')!;
		await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'card', id: card.id, baseVersion: card.version, object: { ...card, name: `${card.name} X` } }], action: 'test' });
		const b = await cut();
		const compared = await (await compareApi.GET(ev('reviewer', `/?a=${a.number}&b=${b.number}`))).json();
		const changed = compared.changed.find((c: { cardId: string }) => c.cardId === card.id);
		expect(changed.fields).toContainEqual({ field: 'card.name', before: card.name, after: `${card.name} X` });

		const res = await diffApi.GET(ev('reviewer', `/?a=${a.id}&b=${b.id}&card=${card.id}&side=front`));
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('image/png');
		expect(Number(res.headers.get('x-paddock-changed-pixels'))).toBeGreaterThan(0);
		const same = await diffApi.GET(ev('reviewer', `/?a=${a.id}&b=${b.id}&card=${other.id}&side=front`));
		expect(Number(same.headers.get('x-paddock-changed-pixels'))).toBe(0);
		// Another team's caller learns nothing.
		expect((await diffApi.GET(ev('outsider', `/?a=${a.id}&b=${b.id}&card=${card.id}`))).status).toBe(404);
	});
});
