import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { requireProof } from '$lib/server/http/proof-access';
import { releaseProof } from '$lib/server/proofs';
import { db } from '$lib/server/runtime';

export const POST: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	const { proof, actor } = await requireProof(d, locals, params.gameId, params.proofId, 'proof.release');
	const released = await releaseProof(d, actor, { proof });
	return json({ proof: { id: released.id, number: released.number, releasedAt: released.releasedAt } });
});
