import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/http/api';
import { requireRole } from '$lib/server/http/guard';
import { saveProfile, deleteProfile } from '$lib/server/printer-profiles';
import { PrinterProfileSchema } from '$lib/schemas/printing';
import { db } from '$lib/server/runtime';

/** Saves a profile; `version` in the body is the version the editor started from. */
export const PUT: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { actor } = await requireRole(d, locals, params.teamId, 'profile.edit');
	const input = await readJson(request, PrinterProfileSchema);
	const profile = await saveProfile(d, actor, { ...input, id: params.profileId });
	return json({ profile });
});

export const DELETE: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	const { actor } = await requireRole(d, locals, params.teamId, 'profile.edit');
	await deleteProfile(d, actor, { id: params.profileId });
	return json({ ok: true });
});
