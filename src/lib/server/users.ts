/** Accounts: creating, finding, resetting passwords. */
import { eq, sql, and, isNull, gt } from 'drizzle-orm';
import type { Db } from './db';
import { users, passwordResets } from './db/schema';
import { hashPassword, verifyPassword } from './auth/passwords';
import { newToken, sha256 } from './auth/secrets';
import { endSessions } from './auth/sessions';

export type User = typeof users.$inferSelect;

export async function findUserByEmail(db: Db, email: string): Promise<User | undefined> {
	const [user] = await db
		.select()
		.from(users)
		.where(sql`lower(${users.email}) = ${email.trim().toLowerCase()}`);
	return user;
}

export async function findUser(db: Db, id: string): Promise<User | undefined> {
	const [user] = await db.select().from(users).where(eq(users.id, id));
	return user;
}

export class EmailTakenError extends Error {
	constructor(readonly holder: User) {
		super('We could not make an account with this address. If it is yours, sign in or reset your password.');
	}
}

/** A person's name for headers and lists; null for nobody or a deleted account. */
export async function userName(db: Db, id: string | null): Promise<string | null> {
	return id ? ((await findUser(db, id))?.name ?? null) : null;
}

export async function createUser(
	db: Db,
	input: { email: string; name: string; password: string }
): Promise<User> {
	// Hashed first, so a taken address answers no faster than a free one.
	const passwordHash = await hashPassword(input.password);
	const existing = await findUserByEmail(db, input.email);
	if (existing) throw new EmailTakenError(existing);
	const [user] = await db
		.insert(users)
		.values({ email: input.email.trim().toLowerCase(), name: input.name.trim(), passwordHash })
		.returning();
	return user;
}

export const RESET_TTL_MS = 60 * 60 * 1000;

/** A one-time reset token for the account, or null when there is no such account. */
export async function startPasswordReset(db: Db, email: string) {
	const user = await findUserByEmail(db, email);
	if (!user) return null;
	const token = newToken();
	await db.insert(passwordResets).values({
		userId: user.id,
		tokenHash: sha256(token),
		expiresAt: new Date(Date.now() + RESET_TTL_MS)
	});
	return { user, token };
}

/** Sets the new password if the token is valid, unused and fresh; false otherwise. */
export async function finishPasswordReset(db: Db, token: string, password: string) {
	const passwordHash = await hashPassword(password);
	return db.transaction(async (tx) => {
		const [reset] = await tx
			.update(passwordResets)
			.set({ usedAt: new Date() })
			.where(
				and(
					eq(passwordResets.tokenHash, sha256(token)),
					isNull(passwordResets.usedAt),
					gt(passwordResets.expiresAt, new Date())
				)
			)
			.returning();
		if (!reset) return false;
		await tx.update(users).set({ passwordHash }).where(eq(users.id, reset.userId));
		// Whoever knew the old password may be signed in somewhere: every session ends.
		await endSessions(tx, reset.userId);
		return true;
	});
}

/**
 * Changes the password of a signed-in person who knows the current one, and ends their other
 * sessions. False when the current password is wrong.
 */
export async function changePassword(
	db: Db,
	input: { userId: string; current: string; password: string; keepSession?: string }
): Promise<boolean> {
	const user = await findUser(db, input.userId);
	if (!user || !(await verifyPassword(user.passwordHash, input.current))) return false;
	await db.update(users).set({ passwordHash: await hashPassword(input.password) }).where(eq(users.id, user.id));
	await endSessions(db, user.id, input.keepSession);
	return true;
}
