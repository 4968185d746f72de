import { error } from '@sveltejs/kit';
import { desc } from 'drizzle-orm';
import { requireUser } from '$lib/server/guard';
import { db, mailIsCaught } from '$lib/server/runtime';
import { caughtMail } from '$lib/server/db/schema';
import { membershipsOf } from '$lib/server/teams';

/** The messages the local mail catcher holds; for owners of an instance that catches mail. */
export const load = async ({ locals }) => {
	const user = requireUser(locals);
	const d = await db();
	if (!(await mailIsCaught())) error(404, 'This instance sends real e-mail; nothing is caught.');
	const memberships = await membershipsOf(d, user.id);
	if (!memberships.some((m) => m.role === 'owner')) error(403, 'Only team owners can read caught mail');
	const messages = await d.select().from(caughtMail).orderBy(desc(caughtMail.createdAt)).limit(200);
	return { messages };
};
