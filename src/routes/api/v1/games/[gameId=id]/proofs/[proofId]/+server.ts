import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { requireProof } from '$lib/server/http/proof-access';
import { commentsOf, verdictsOf, snapshotOf, isReleased } from '$lib/server/proofs';
import { db } from '$lib/server/runtime';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	const { proof, role } = await requireProof(d, locals, params.gameId, params.proofId);
	const game = snapshotOf(proof);
	const kinds = new Map(game.kinds.map((k) => [k.id, k]));
	return json({
		proof: {
			id: proof.id,
			number: proof.number,
			description: proof.description,
			createdAt: proof.createdAt,
			releasedAt: proof.releasedAt,
			withdrawnAt: proof.withdrawnAt,
			released: isReleased(proof)
		},
		cards: game.cards.map((c) => ({ id: c.id, name: c.name, kindId: c.kindId, kindName: kinds.get(c.kindId)?.name, copies: c.copies })),
		comments: role === 'printer' ? [] : await commentsOf(d, proof.id),
		verdicts: role === 'printer' ? [] : (await verdictsOf(d, proof.id)).current
	});
});
