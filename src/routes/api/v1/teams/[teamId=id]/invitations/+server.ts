import type { RequestHandler } from './$types';
import { json } from '@sveltejs/kit';
import { api, readJson } from '$lib/server/http/api';
import { requireRole } from '$lib/server/http/guard';
import { db } from '$lib/server/runtime';
import { findTeam, invite } from '$lib/server/teams';
import { mailInvitation } from '$lib/server/notify';
import { inviteSchema } from '$lib/schemas/account';

export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { user, actor } = await requireRole(d, locals, params.teamId, 'members.manage');
	const input = await readJson(request, inviteSchema);
	const team = (await findTeam(d, params.teamId))!;
	const { invitation, token } = await invite(d, actor, input);
	await mailInvitation({ to: invitation.email, inviter: user.name, team: team.name, role: invitation.role, token, expiresAt: invitation.expiresAt });
	return json(
		{ invitation: { id: invitation.id, email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt } },
		{ status: 201 }
	);
});
