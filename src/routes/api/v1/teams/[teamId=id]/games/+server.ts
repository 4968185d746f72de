import type { RequestHandler } from './$types';
import { json } from '@sveltejs/kit';
import { api, readJson } from '$lib/server/http/api';
import { requireRole } from '$lib/server/http/guard';
import { db } from '$lib/server/runtime';
import { createGame, gamesOf } from '$lib/server/games';
import { gameCreateSchema } from '$lib/schemas/account';

const publicGame = (g: Awaited<ReturnType<typeof gamesOf>>[number]) => ({
	id: g.id,
	name: g.name,
	slug: g.slug,
	bleedStandard: g.bleedStandard,
	defaultCardSize: g.defaultCardSize,
	updatedAt: g.updatedAt
});

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	await requireRole(d, locals, params.teamId, 'team.read');
	return json({ games: (await gamesOf(d, params.teamId)).map(publicGame) });
});

export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { actor } = await requireRole(d, locals, params.teamId, 'game.create');
	const input = await readJson(request, gameCreateSchema);
	const game = await createGame(d, actor, input);
	return json({ game: publicGame(game) }, { status: 201 });
});
