import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/http/api';
import { requireGameRole } from '$lib/server/http/guard';
import { setMuted, isMuted } from '$lib/server/proofs';
import { db } from '$lib/server/runtime';
import { MuteSchema, type ApiAnswer } from '$lib/schemas/api';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	const { user } = await requireGameRole(d, locals, params.gameId, 'release.read');
	return json({ muted: await isMuted(d, user.id, params.gameId) } satisfies ApiAnswer<typeof MuteSchema>);
});

/** `{ muted: true }` stops this game's e-mail to the caller; false starts it again. */
export const PUT: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { actor } = await requireGameRole(d, locals, params.gameId, 'release.read');
	const { muted } = await readJson(request, MuteSchema);
	await setMuted(d, actor, { muted });
	return json({ muted } satisfies ApiAnswer<typeof MuteSchema>);
});
