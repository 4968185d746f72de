import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/http/api';
import { requireGameRole, may } from '$lib/server/http/guard';
import { cutProof, proofsOf, CutSchema, isReleased } from '$lib/server/proofs';
import { db } from '$lib/server/runtime';
import type { ApiAnswer, ProofCutSchema } from '$lib/schemas/api';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	const { role } = await requireGameRole(d, locals, params.gameId, 'release.read');
	const list = await proofsOf(d, params.gameId, !may(role, 'game.read'));
	return json({
		proofs: list.map((p) => ({
			id: p.id,
			number: p.number,
			description: p.description,
			createdAt: p.createdAt,
			releasedAt: p.releasedAt,
			withdrawnAt: p.withdrawnAt,
			released: isReleased(p)
		}))
	});
});

export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { actor } = await requireGameRole(d, locals, params.gameId, 'proof.cut');
	const { description } = await readJson(request, CutSchema);
	const proof = await cutProof(d, actor, { description });
	return json({ id: proof.id, number: proof.number } satisfies ApiAnswer<typeof ProofCutSchema>, { status: 201 });
});
