import type { RequestHandler } from './$types';
import { json } from '@sveltejs/kit';
import { api } from '$lib/server/http/api';
import { requireRole, may } from '$lib/server/http/guard';
import { db } from '$lib/server/runtime';
import { membersOf, pendingInvitations } from '$lib/server/teams';
import type { ApiAnswer, MembersSchema } from '$lib/schemas/api';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	const { role, user } = await requireRole(d, locals, params.teamId, 'team.read');
	const manage = may(role, 'members.manage');
	const members = await membersOf(d, params.teamId);
	const invitations = manage ? await pendingInvitations(d, params.teamId) : [];
	return json({
		you: { userId: user.id, role, mayManage: manage },
		members: members.map((m) => ({ ...m, since: m.since.toISOString() })),
		invitations: invitations.map(({ acceptedAt: _accepted, ...i }) => ({ ...i, expiresAt: i.expiresAt.toISOString() }))
	} satisfies ApiAnswer<typeof MembersSchema>);
});
