import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/http/api';
import { requireGameRole } from '$lib/server/http/guard';
import { runOdds } from '$lib/server/odds';
import { db } from '$lib/server/runtime';

/**
 * A stage scenario plus `"exact": true` or `"samples": N, "seed": S` (or `"race": { "players": N }`
 * with samples for whole races): the odds and the game's wager cards priced. Large runs answer 202
 * with a job to poll at /api/v1/odds-jobs/{id}.
 */
export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { actor } = await requireGameRole(d, locals, params.gameId, 'game.read');
	const body = await readJson(request, z.unknown());
	const out = await runOdds(d, actor, body);
	return 'answer' in out ? json(out.answer) : json({ job: out.job, poll: `/api/v1/odds-jobs/${out.job.id}` }, { status: 202 });
});
