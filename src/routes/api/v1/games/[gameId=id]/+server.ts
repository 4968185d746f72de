import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/http/api';
import { requireGameRole } from '$lib/server/http/guard';
import { loadGame } from '$lib/server/game-store';
import { deleteGame, DeleteGameSchema } from '$lib/server/game-lifecycle';
import { db } from '$lib/server/runtime';

/** The whole game as one document (the same shape as game.json in a bundle). */
export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	await requireGameRole(d, locals, params.gameId, 'game.read');
	return json({ game: await loadGame(d, params.gameId) });
});

/**
 * Deletes the game, its proofs and its files: owners only, confirmed with the game's name,
 * `{ "confirm": "<name>" }` as the body or `?confirm=<name>`.
 */
export const DELETE: RequestHandler = api(async ({ locals, params, request, url }) => {
	const d = await db();
	const { game, actor } = await requireGameRole(d, locals, params.gameId, 'game.delete');
	const typed = url.searchParams.get('confirm');
	const input = typed !== null ? DeleteGameSchema.parse({ confirm: typed.slice(0, 200) }) : await readJson(request, DeleteGameSchema);
	const deleted = await deleteGame(d, actor, input);
	return json({ deleted: { id: game.id, name: deleted.name } });
});
