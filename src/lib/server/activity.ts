import type { Db } from './db';
import { activity } from './db/schema';

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
