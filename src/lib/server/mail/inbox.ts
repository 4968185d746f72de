/**
 * Reading caught mail in the app. A caught message is shown to its own recipient and to no one
 * else: mail carries reset and invitation links, and whoever reads a reset link owns the account.
 * Team owners, invitations and demo mode grant nothing more; the operator who runs the instance
 * reads the `caught_mail` table directly.
 */
import { desc, sql } from 'drizzle-orm';
import type { Db } from '../db';
import { caughtMail } from '../db/schema';

export type CaughtMail = typeof caughtMail.$inferSelect;

/** The bare addresses of a header such as `Ann <ann@x.test>, bo@y.test`, lower-cased. */
export function recipientsOf(to: string): string[] {
	return to
		.split(',')
		.map((part) => (part.match(/<([^>]*)>/)?.[1] ?? part).trim().toLowerCase())
		.filter(Boolean);
}

/** The newest messages addressed to this person. */
export async function mailFor(db: Db, email: string, limit = 200): Promise<CaughtMail[]> {
	const address = email.trim().toLowerCase();
	// The database narrows by substring; the exact address match below decides.
	const candidates = await db
		.select()
		.from(caughtMail)
		.where(sql`position(${address} in lower(${caughtMail.to})) > 0`)
		.orderBy(desc(caughtMail.createdAt))
		.limit(limit * 2);
	return candidates.filter((m) => recipientsOf(m.to).includes(address)).slice(0, limit);
}
