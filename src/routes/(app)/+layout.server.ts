import { redirect } from '@sveltejs/kit';
import { db, mailIsCaught } from '$lib/server/runtime';
import { membershipsOf } from '$lib/server/teams';

/** Every page in (app) needs a signed-in person; loads who they are and their teams once. */
export const load = async ({ locals, url }) => {
	if (!locals.user) redirect(303, `/signin?next=${encodeURIComponent(url.pathname + url.search)}`);
	const memberships = await membershipsOf(await db(), locals.user.id);
	return {
		user: locals.user,
		memberships,
		showMail: await mailIsCaught()
	};
};
