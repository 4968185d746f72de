import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { ArtSaveSchema, ObjectSaveSchema } from '$lib/server/http/requests';
import { api, readJson } from '$lib/server/http/api';
import { requireGameRole } from '$lib/server/http/guard';
import { applyChanges, loadGame, COLLECTION_FIELD } from '$lib/server/game-store';
import type { Collection } from '$lib/schemas/collections';
import { collectionOf, objectIdParam, requireGameEdit } from '$lib/server/http/game-access';
import { db } from '$lib/server/runtime';
import { NotFound, Invalid } from '$lib/server/refusals';

async function findObject(gameId: string, collection: Collection, id: string) {
	const game = await loadGame(await db(), gameId);
	const found = (game[COLLECTION_FIELD[collection]] as { id: string }[]).find((o) => o.id === id);
	if (!found) throw new NotFound(`No such ${collection}`);
	return found;
}

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const collection = collectionOf(params.collection);
	const id = objectIdParam(params.objectId);
	await requireGameRole(await db(), locals, params.gameId, 'game.read');
	return json({ [collection]: await findObject(params.gameId, collection, id) });
});

/** Saves an object; `version` in the body is the version the editor started from. */
export const PUT: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const collection = collectionOf(params.collection);
	const id = objectIdParam(params.objectId);
	const { actor } = await requireGameEdit(d, locals, params.gameId, collection);
	// Art's own fields are checked here (its file changes only by uploading); other objects in full when saved.
	const body = await readJson(
		request,
		collection === 'art' ? ArtSaveSchema : ObjectSaveSchema
	);
	const { version, ...sent } = body;
	// The file behind an art piece changes only by uploading; here only its status and slot.
	const object = collection === 'art' ? { ...(await findObject(params.gameId, collection, id)), status: sent.status, assignment: sent.assignment } : sent;
	const after = await applyChanges(d, actor, {
		changes: [{ collection, id, baseVersion: version, object: { ...object, id } }],
		action: `${collection}.saved`
	});
	return json({ [collection]: (after[COLLECTION_FIELD[collection]] as { id: string }[]).find((o) => o.id === id) });
});

/** Deletes an object; `?version=` is the version the person saw. */
export const DELETE: RequestHandler = api(async ({ locals, params, url }) => {
	const d = await db();
	const collection = collectionOf(params.collection);
	const id = objectIdParam(params.objectId);
	const { actor } = await requireGameEdit(d, locals, params.gameId, collection);
	const version = Number(url.searchParams.get('version'));
	if (!Number.isInteger(version) || version < 1) throw new Invalid('Say which version you are deleting: ?version=N');
	await applyChanges(d, actor, { changes: [{ collection, id, baseVersion: version, remove: true }], action: `${collection}.deleted` });
	return json({ ok: true });
});
