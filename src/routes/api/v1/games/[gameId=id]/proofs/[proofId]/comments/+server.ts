import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/http/api';
import { requireProof } from '$lib/server/http/proof-access';
import { addComment, commentsOf, CommentSchema } from '$lib/server/proofs';
import { db } from '$lib/server/runtime';

/** The proof's comments; `?since=` (ISO time) returns only newer ones, for polling. */
export const GET: RequestHandler = api(async ({ locals, params, url }) => {
	const d = await db();
	const { proof } = await requireProof(d, locals, params.gameId, params.proofId, 'proof.comment');
	const all = await commentsOf(d, proof.id);
	const since = url.searchParams.get('since');
	return json({ comments: all, now: new Date().toISOString(), changedSince: since });
});

export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { proof, actor } = await requireProof(d, locals, params.gameId, params.proofId, 'proof.comment');
	const input = await readJson(request, CommentSchema);
	const comment = await addComment(d, actor, { proof, comment: input });
	return json({ comment }, { status: 201 });
});
