import type { RequestHandler } from './$types';
import { json } from '@sveltejs/kit';
import { api } from '$lib/server/api';
import { requireRole, may } from '$lib/server/guard';
import { db } from '$lib/server/runtime';
import { membersOf, pendingInvitations } from '$lib/server/teams';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	const { role, user } = await requireRole(d, locals, params.teamId, 'team.read');
	const manage = may(role, 'members.manage');
	return json({
		you: { userId: user.id, role, mayManage: manage },
		members: await membersOf(d, params.teamId),
		invitations: manage ? await pendingInvitations(d, params.teamId) : []
	});
});
