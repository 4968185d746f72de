import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireGameRole } from '$lib/server/guard';
import { loadGame } from '$lib/server/game-store';
import { db } from '$lib/server/runtime';

/** The whole game as one document (the same shape as game.json in a bundle). */
export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	await requireGameRole(d, locals, params.gameId, 'game.read');
	return json({ game: await loadGame(d, params.gameId) });
});
