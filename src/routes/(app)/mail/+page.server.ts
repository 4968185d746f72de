import { error } from '@sveltejs/kit';
import { desc, eq, and, inArray } from 'drizzle-orm';
import { requireUser } from '$lib/server/guard';
import { db, mailIsCaught } from '$lib/server/runtime';
import { caughtMail, memberships, invitations, users } from '$lib/server/db/schema';

/**
 * The messages the local mail catcher holds, for owners of an instance that catches mail:
 * those sent to themselves, to members of the teams they own and to people those teams invited.
 */
export const load = async ({ locals }) => {
	const user = requireUser(locals);
	const d = await db();
	if (!(await mailIsCaught())) error(404, 'This instance sends real e-mail; nothing is caught.');
	const owned = (
		await d
			.select({ teamId: memberships.teamId })
			.from(memberships)
			.where(and(eq(memberships.userId, user.id), eq(memberships.role, 'owner')))
	).map((r) => r.teamId);
	if (owned.length === 0) error(403, 'Only team owners can read caught mail');
	const memberEmails = await d
		.select({ email: users.email })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(inArray(memberships.teamId, owned));
	const invited = await d
		.select({ email: invitations.email })
		.from(invitations)
		.where(inArray(invitations.teamId, owned));
	const audience = new Set([user.email, ...memberEmails.map((r) => r.email), ...invited.map((r) => r.email)].map((e) => e.toLowerCase()));
	const messages = (await d.select().from(caughtMail).orderBy(desc(caughtMail.createdAt)).limit(500))
		.filter((m) => m.to.split(',').some((to) => audience.has(to.replace(/.*</, '').replace(/>.*/, '').trim().toLowerCase())));
	return { messages: messages.slice(0, 200) };
};
