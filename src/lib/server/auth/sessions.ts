/**
 * Browser sessions that can be ended. The signed cookie carries a session id; every request
 * checks that its row is still open, so signing out, ending a session from the account page, or
 * resetting or changing the password takes effect at once. API tokens are separate and stay.
 */
import { and, desc, eq, gt, isNull, ne } from 'drizzle-orm';
import type { Db } from '../db';
import { sessions, users } from '../db/schema';

/** Matches the cookie's lifetime; a session unused this long is over. */
export const SESSION_MAX_AGE_S = 30 * 24 * 60 * 60;
/** Last-seen times are written at most this often, so reads do not each cost a write. */
const TOUCH_EVERY_MS = 60 * 1000;

export type Session = typeof sessions.$inferSelect;

export async function startSession(
	db: Db,
	userId: string,
	from: { userAgent?: string; address?: string } = {}
): Promise<string> {
	const [row] = await db
		.insert(sessions)
		.values({ userId, userAgent: (from.userAgent ?? '').slice(0, 300), address: (from.address ?? '').slice(0, 100) })
		.returning({ id: sessions.id });
	return row.id;
}

const openSince = () => new Date(Date.now() - SESSION_MAX_AGE_S * 1000);

/** Who a session belongs to, as each request needs it. */
export interface SessionUser {
	id: string;
	email: string;
	name: string;
}

/**
 * The person while the session is open and theirs, else null; notes that it was used. One query
 * answers both (every signed-in request asks, and the embedded database answers one at a time).
 */
export async function openSessionUser(db: Db, id: string, userId: string): Promise<SessionUser | null> {
	const [row] = await db
		.select({ id: users.id, email: users.email, name: users.name, lastSeenAt: sessions.lastSeenAt })
		.from(sessions)
		.innerJoin(users, eq(users.id, sessions.userId))
		.where(and(eq(sessions.id, id), eq(sessions.userId, userId), isNull(sessions.endedAt), gt(sessions.lastSeenAt, openSince())));
	if (!row) return null;
	if (Date.now() - row.lastSeenAt.getTime() > TOUCH_EVERY_MS) {
		await db.update(sessions).set({ lastSeenAt: new Date() }).where(eq(sessions.id, id));
	}
	return { id: row.id, email: row.email, name: row.name };
}

/** The person's open sessions, most recently used first. */
export async function openSessions(db: Db, userId: string): Promise<Session[]> {
	return db
		.select()
		.from(sessions)
		.where(and(eq(sessions.userId, userId), isNull(sessions.endedAt), gt(sessions.lastSeenAt, openSince())))
		.orderBy(desc(sessions.lastSeenAt));
}

/** Ends one session of this user; false when there is no such open session. */
export async function endSession(db: Db, userId: string, id: string): Promise<boolean> {
	const ended = await db
		.update(sessions)
		.set({ endedAt: new Date() })
		.where(and(eq(sessions.id, id), eq(sessions.userId, userId), isNull(sessions.endedAt)))
		.returning({ id: sessions.id });
	return ended.length > 0;
}

/** Ends every session of the user, or every one but `except` (the caller's own). */
export async function endSessions(db: Db | Parameters<Parameters<Db['transaction']>[0]>[0], userId: string, except?: string): Promise<number> {
	const ended = await db
		.update(sessions)
		.set({ endedAt: new Date() })
		.where(and(eq(sessions.userId, userId), isNull(sessions.endedAt), except ? ne(sessions.id, except) : undefined))
		.returning({ id: sessions.id });
	return ended.length;
}
