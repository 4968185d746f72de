import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/http/api';
import { requireGameRole } from '$lib/server/http/guard';
import { listScenarios, saveScenario } from '$lib/server/odds';
import { db } from '$lib/server/runtime';

/** The game's saved scenarios: name, scenario and the answer of its last run. */
export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	const { actor } = await requireGameRole(d, locals, params.gameId, 'game.read');
	return json({ scenarios: await listScenarios(d, actor) });
});

/** Saves `{ name, scenario, lastResult? }`; the same name again replaces it. */
export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { actor } = await requireGameRole(d, locals, params.gameId, 'game.read');
	const body = await readJson(request, z.unknown());
	const saved = await saveScenario(d, actor, body);
	return json(saved, { status: 201 });
});
