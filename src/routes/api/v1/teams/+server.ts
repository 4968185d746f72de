import type { RequestHandler } from './$types';
import { json } from '@sveltejs/kit';
import { api, readJson } from '$lib/server/http/api';
import { actorOf, requireUser } from '$lib/server/http/guard';
import { db } from '$lib/server/runtime';
import { createTeam, membershipsOf } from '$lib/server/teams';
import { teamSchema } from '$lib/schemas/account';

export const GET: RequestHandler = api(async ({ locals }) => {
	const user = requireUser(locals);
	return json({ teams: await membershipsOf(await db(), user.id) });
});

export const POST: RequestHandler = api(async ({ locals, request }) => {
	const user = requireUser(locals);
	const input = await readJson(request, teamSchema);
	const team = await createTeam(await db(), actorOf(user), input);
	return json({ team: { id: team.id, name: team.name } }, { status: 201 });
});
