/**
 * Authorisation in one place. Every load, action and API handler asks `requireRole` (or
 * `requireUser`) before it reads or writes; what each role may do is the table below.
 * A person who is not a member of the team gets 404, so other teams' ids reveal nothing.
 */
import { error } from '@sveltejs/kit';
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

export function requireUser(locals: App.Locals): SignedIn {
	if (!locals.user) error(401, 'Sign in first');
	return locals.user;
}

export async function roleIn(db: Db, userId: string, teamId: string): Promise<Role | null> {
	const [row] = await db
		.select({ role: memberships.role })
		.from(memberships)
		.where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
	return row?.role ?? null;
}

/** The caller's role in the team, if it allows `permission`; 401, 403 or 404 otherwise. */
export async function requireRole(
	db: Db,
	locals: App.Locals,
	teamId: string,
	permission: Permission
): Promise<{ user: SignedIn; role: Role }> {
	const user = requireUser(locals);
	const role = await roleIn(db, user.id, teamId);
	if (!role) error(404, 'No such team');
	if (!may(role, permission)) error(403, `A ${role} may not do this`);
	return { user, role };
}

/** As requireRole, for a game: finds its team first. 404 for games of other teams. */
export async function requireGameRole(
	db: Db,
	locals: App.Locals,
	gameId: string,
	permission: Permission
) {
	const user = requireUser(locals);
	const [game] = await db.select().from(games).where(eq(games.id, gameId));
	if (!game) error(404, 'No such game');
	const role = await roleIn(db, user.id, game.teamId);
	if (!role) error(404, 'No such game');
	if (!may(role, permission)) error(403, `A ${role} may not do this`);
	return { user, role, game };
}
