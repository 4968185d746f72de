import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/http/guard';
import { db, mailIsCaught } from '$lib/server/runtime';
import { mailFor } from '$lib/server/mail/inbox';

/** The caught messages addressed to the signed-in person, and only those. */
export const load = async ({ locals }) => {
	const user = requireUser(locals);
	if (!(await mailIsCaught())) error(404, 'This instance sends real e-mail; nothing is caught.');
	return { email: user.email, messages: await mailFor(await db(), user.email) };
};
