import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/http/api';
import { requireProof } from '$lib/server/http/proof-access';
import { withdrawProof, WithdrawSchema } from '$lib/server/proofs';
import { db } from '$lib/server/runtime';

export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { proof, actor } = await requireProof(d, locals, params.gameId, params.proofId, 'proof.release');
	// The note is optional: a body is read whenever one is sent, chunked or not.
	const hasBody = request.headers.has('content-type') || Number(request.headers.get('content-length') ?? 0) > 0;
	const { note } = hasBody ? await readJson(request, WithdrawSchema) : { note: '' };
	const withdrawn = await withdrawProof(d, actor, { proof, note });
	return json({ proof: { id: withdrawn.id, number: withdrawn.number, withdrawnAt: withdrawn.withdrawnAt } });
});
