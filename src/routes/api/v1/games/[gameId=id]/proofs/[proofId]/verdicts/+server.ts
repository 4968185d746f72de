import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/http/api';
import { requireProof } from '$lib/server/http/proof-access';
import { giveVerdict, verdictsOf, VerdictSchema } from '$lib/server/proofs';
import { db } from '$lib/server/runtime';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	const { proof } = await requireProof(d, locals, params.gameId, params.proofId, 'game.read');
	return json(await verdictsOf(d, proof.id));
});

export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { proof, actor } = await requireProof(d, locals, params.gameId, params.proofId, 'proof.verdict');
	const input = await readJson(request, VerdictSchema);
	const verdict = await giveVerdict(d, actor, { proof, ...input });
	return json({ verdict }, { status: 201 });
});
