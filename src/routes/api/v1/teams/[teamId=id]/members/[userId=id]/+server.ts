import type { RequestHandler } from './$types';
import { json } from '@sveltejs/kit';
import { api, readJson } from '$lib/server/http/api';
import { requireRole } from '$lib/server/http/guard';
import { db } from '$lib/server/runtime';
import { changeRole, removeMember } from '$lib/server/teams';
import { roleChangeSchema } from '$lib/schemas/account';

export const PATCH: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { actor } = await requireRole(d, locals, params.teamId, 'members.manage');
	const { role } = await readJson(request, roleChangeSchema);
	await changeRole(d, actor, { userId: params.userId, role });
	return json({ ok: true });
});

export const DELETE: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	const { actor } = await requireRole(d, locals, params.teamId, 'members.manage');
	await removeMember(d, actor, { userId: params.userId });
	return json({ ok: true });
});
