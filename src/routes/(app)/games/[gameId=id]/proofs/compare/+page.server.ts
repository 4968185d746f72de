import { error } from '@sveltejs/kit';
import { requireGameRole } from '$lib/server/http/guard';
import { proofsOf, snapshotOf } from '$lib/server/proofs';
import { compareGames } from '$lib/game/compare';
import { db } from '$lib/server/runtime';
import { proofForPage, cardsOf } from '$lib/server/http/proof-pages';

/** ?a=<proof>&b=<proof>: the cards added, removed and changed from a to b, with their face boxes. */
export const load = async ({ locals, params, url }) => {
	const d = await db();
	await requireGameRole(d, locals, params.gameId, 'game.read');
	const a = url.searchParams.get('a');
	const b = url.searchParams.get('b');
	const list = (await proofsOf(d, params.gameId, false)).map((p) => ({ id: p.id, number: p.number, description: p.description }));
	if (!a || !b) {
		if (list.length < 2) error(404, 'There are not two proofs to compare yet');
		return { list, picked: null };
	}
	const first = (await proofForPage(d, locals, params.gameId, a, 'game.read')).proof;
	const second = (await proofForPage(d, locals, params.gameId, b, 'game.read')).proof;
	const before = snapshotOf(first);
	const after = snapshotOf(second);
	const face = (cards: ReturnType<typeof cardsOf>) => new Map(cards.map((c) => [c.id, { widthMm: c.widthMm, heightMm: c.heightMm }]));
	return {
		list,
		picked: {
			a: { id: first.id, number: first.number, description: first.description },
			b: { id: second.id, number: second.number, description: second.description },
			...compareGames(before, after),
			facesA: Object.fromEntries(face(cardsOf(before))),
			facesB: Object.fromEntries(face(cardsOf(after)))
		}
	};
};
