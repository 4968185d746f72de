/**
 * Who may do what: the role table every load, action and API handler is checked against, and
 * the one query that finds a caller's role in a game's team with the game row. The request-side
 * guard (http/guard.ts) asks here once per request and hands services the answer as an actor (./actor.ts).
 */
import { and, eq } from 'drizzle-orm';
import type { Db } from './db';
import { memberships, games, type Role } from './db/schema';

export const PERMISSIONS = {
	/** See the team, its members and its game list. */
	'team.read': ['owner', 'designer', 'artist', 'printer', 'reviewer'],
	'members.manage': ['owner'],
	'game.create': ['owner', 'designer'],
	'game.delete': ['owner'],
	/** Read a game's working data, art and unreleased proofs. */
	'game.read': ['owner', 'designer', 'artist', 'reviewer'],
	/** Change runners, card kinds, money tables, tiles, setup tables. */
	'game.edit': ['owner', 'designer'],
	'art.edit': ['owner', 'designer', 'artist'],
	'proof.cut': ['owner', 'designer'],
	'proof.comment': ['owner', 'designer', 'artist', 'reviewer'],
	'proof.verdict': ['owner', 'reviewer'],
	'proof.release': ['owner', 'designer'],
	/** Released proofs and their files. */
	'release.read': ['owner', 'designer', 'artist', 'printer', 'reviewer'],
	/** Add, change and delete the team's printer profiles: printers keep them, whoever made one. */
	'profile.edit': ['owner', 'designer', 'printer']
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export const may = (role: Role, permission: Permission) =>
	(PERMISSIONS[permission] as readonly Role[]).includes(role);

export interface SignedIn {
	id: string;
	email: string;
	name: string;
}

export type GameRow = typeof games.$inferSelect;


export async function roleIn(db: Db, userId: string, teamId: string): Promise<Role | null> {
	const [row] = await db
		.select({ role: memberships.role })
		.from(memberships)
		.where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
	return row?.role ?? null;
}

/** The game row and the caller's role in its team, in one query (role null for outsiders). */
export async function gameAccess(db: Db, userId: string, gameId: string): Promise<{ role: Role | null; game: GameRow } | null> {
	const [row] = await db
		.select({ game: games, role: memberships.role })
		.from(games)
		.leftJoin(memberships, and(eq(memberships.teamId, games.teamId), eq(memberships.userId, userId)))
		.where(eq(games.id, gameId));
	return row ? { game: row.game, role: row.role } : null;
}
