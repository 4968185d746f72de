import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { ObjectCreateSchema } from '$lib/server/http/requests';
import { api, readJson } from '$lib/server/http/api';
import { requireGameRole } from '$lib/server/http/guard';
import { applyChanges, loadGame, COLLECTION_FIELD } from '$lib/server/game-store';
import type { Collection } from '$lib/schemas/collections';
import { collectionOf, requireGameEdit } from '$lib/server/http/game-access';
import { db } from '$lib/server/runtime';
import { newId } from '$lib/game/model';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	const collection = collectionOf(params.collection);
	await requireGameRole(d, locals, params.gameId, 'game.read');
	const game = await loadGame(d, params.gameId);
	if (collection === 'card') {
		const kinds = new Map(game.kinds.map((k) => [k.id, k]));
		return json({
			cards: game.cards.map((c) => ({ ...c, kind: kinds.get(c.kindId)?.type, kindName: kinds.get(c.kindId)?.name }))
		});
	}
	return json({ [COLLECTION_FIELD[collection]]: game[COLLECTION_FIELD[collection]] });
});

/** Creates an object; the body is the object without version (an id is made when absent). */
export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const collection = collectionOf(params.collection);
	const { actor } = await requireGameEdit(d, locals, params.gameId, collection);
	// An art piece is made by uploading its file, which checks the file and records its version.
	if (collection === 'art') error(405, 'Upload art with POST /api/v1/games/{gameId}/art/upload');
	const body = await readJson(request, ObjectCreateSchema);
	const id = body.id ?? newId();
	const after = await applyChanges(d, actor, {
		changes: [{ collection, id, baseVersion: null, object: { ...body, id } }],
		action: `${collection}.created`
	});
	const made = (after[COLLECTION_FIELD[collection]] as { id: string }[]).find((o) => o.id === id);
	return json({ [collection]: made }, { status: 201 });
});
