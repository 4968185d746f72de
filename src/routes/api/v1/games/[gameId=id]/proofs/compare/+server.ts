import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { requireProof } from '$lib/server/http/proof-access';
import { snapshotOf } from '$lib/server/proofs';
import { compareGames } from '$lib/game/compare';
import { db } from '$lib/server/runtime';
import { Invalid } from '$lib/server/refusals';

/** ?a=<proof>&b=<proof> (ids or numbers): the cards added, removed and changed from a to b. */
export const GET: RequestHandler = api(async ({ locals, params, url }) => {
	const d = await db();
	const a = url.searchParams.get('a');
	const b = url.searchParams.get('b');
	if (!a || !b) throw new Invalid('Name two proofs: ?a=1&b=2');
	const first = await requireProof(d, locals, params.gameId, a, 'game.read');
	const second = await requireProof(d, locals, params.gameId, b, 'game.read');
	return json({
		a: { id: first.proof.id, number: first.proof.number },
		b: { id: second.proof.id, number: second.proof.number },
		...compareGames(snapshotOf(first.proof), snapshotOf(second.proof))
	});
});
