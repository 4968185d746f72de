import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/http/api';
import { requireRole } from '$lib/server/http/guard';
import { profilesOf, saveProfile } from '$lib/server/printer-profiles';
import { PrinterProfileSchema } from '$lib/schemas/printing';
import { db } from '$lib/server/runtime';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	await requireRole(d, locals, params.teamId, 'team.read');
	return json({ profiles: await profilesOf(d, params.teamId) });
});

export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { actor } = await requireRole(d, locals, params.teamId, 'profile.edit');
	const input = await readJson(request, PrinterProfileSchema);
	const profile = await saveProfile(d, actor, { ...input, id: undefined });
	return json({ profile }, { status: 201 });
});
