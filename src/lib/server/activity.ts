import { and, desc, eq, lt } from 'drizzle-orm';
import type { Db } from './db';
import { activity, users } from './db/schema';

/** One line in the team's (and game's) activity log. */
export async function logActivity(
	db: Db,
	entry: {
		teamId: string;
		gameId?: string | null;
		userId?: string | null;
		action: string;
		detail?: Record<string, unknown>;
	}
) {
	await db.insert(activity).values({ ...entry, detail: entry.detail ?? {} });
}

/** A game's log, newest first: `limit` lines older than `before` (all when null), with who did each. */
export async function activityOf(db: Db, gameId: string, { before, limit }: { before: Date | null; limit: number }) {
	return db
		.select({ id: activity.id, action: activity.action, detail: activity.detail, createdAt: activity.createdAt, who: users.name })
		.from(activity)
		.leftJoin(users, eq(users.id, activity.userId))
		.where(before ? and(eq(activity.gameId, gameId), lt(activity.createdAt, before)) : eq(activity.gameId, gameId))
		.orderBy(desc(activity.createdAt), desc(activity.id))
		.limit(limit);
}
