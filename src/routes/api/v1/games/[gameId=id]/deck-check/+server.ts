import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { requireGameRole } from '$lib/server/http/guard';
import { loadGame } from '$lib/server/game-store';
import { checkDeck } from '$lib/game/deck-check';
import { db } from '$lib/server/runtime';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	await requireGameRole(d, locals, params.gameId, 'game.read');
	return json(checkDeck(await loadGame(d, params.gameId)));
});
