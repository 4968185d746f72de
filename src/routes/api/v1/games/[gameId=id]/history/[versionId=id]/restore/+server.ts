import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/http/api';
import { requireGameRole } from '$lib/server/http/guard';
import { requireGameEdit } from '$lib/server/http/game-access';
import { restoreVersion, RestoreSchema, versionOf } from '$lib/server/history';
import { db } from '$lib/server/runtime';

/** Brings back a recorded version as a new one; `{ "version": N }` is the version the caller saw (null: saw it deleted). */
export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	await requireGameRole(d, locals, params.gameId, 'game.read');
	const { collection } = await versionOf(d, params.gameId, params.versionId);
	const { actor } = await requireGameEdit(d, locals, params.gameId, collection);
	const seen = await readJson(request, RestoreSchema);
	const restored = await restoreVersion(d, actor, { versionId: params.versionId, ...seen });
	return json({ restored }, { status: 201 });
});
