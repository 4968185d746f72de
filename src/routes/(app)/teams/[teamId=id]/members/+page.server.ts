import { requireRole } from '$lib/server/http/guard';
import { findTeam } from '$lib/server/teams';
import { db } from '$lib/server/runtime';

/** Only the frame: the member list itself is fetched from the API by the page. */
export const load = async ({ locals, params }) => {
	const d = await db();
	await requireRole(d, locals, params.teamId, 'team.read');
	const team = (await findTeam(d, params.teamId))!;
	return { team: { id: team.id, name: team.name } };
};
