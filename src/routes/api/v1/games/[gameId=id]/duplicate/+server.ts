import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { requireGameRole } from '$lib/server/http/guard';
import { duplicateGame } from '$lib/server/game-lifecycle';
import { db } from '$lib/server/runtime';

/** A new game of the same team with its own copy of this one's data and art. */
export const POST: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	const { game, actor } = await requireGameRole(d, locals, params.gameId, 'game.create');
	const copy = await duplicateGame(d, actor);
	return json({ game: { id: copy.id, name: copy.name, slug: copy.slug } }, { status: 201 });
});
