/**
 * Authorisation in one place. Every load, action and API handler asks `requireRole` (or
 * `requireUser`) before it reads or writes; what each role may do is the table below.
 * A person who is not a member of the team gets 404, so other teams' ids reveal nothing.
 */
import { error } from '@sveltejs/kit';
import { and, eq } from 'drizzle-orm';
import type { Db } from './db';
import { memberships, games, type Role } from './db/schema';
import { loadGame } from './game-store';
import type { Game } from '$lib/game/model';

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

type GameRow = typeof games.$inferSelect;

export interface GameAccess {
	user: SignedIn;
	role: Role;
	game: GameRow;
}

/**
 * What one request knows about a game: the caller's role and the game row (one query), and the
 * whole game document once a page asks for it. Kept per `locals` object, which SvelteKit shares
 * between the layout and page loads (and the action) of one request.
 */
interface RequestGame {
	access: Promise<{ role: Role | null; game: GameRow } | null>;
	doc?: Promise<Game>;
}
const perRequest = new WeakMap<App.Locals, Map<string, RequestGame>>();

function requestGame(db: Db, locals: App.Locals, user: SignedIn, gameId: string): RequestGame {
	let games_ = perRequest.get(locals);
	if (!games_) perRequest.set(locals, (games_ = new Map()));
	let entry = games_.get(gameId);
	if (!entry) {
		entry = { access: readAccess(db, user.id, gameId) };
		games_.set(gameId, entry);
	}
	return entry;
}

/** The game row and the caller's role in its team, in one query. */
async function readAccess(db: Db, userId: string, gameId: string) {
	const [row] = await db
		.select({ game: games, role: memberships.role })
		.from(games)
		.leftJoin(memberships, and(eq(memberships.teamId, games.teamId), eq(memberships.userId, userId)))
		.where(eq(games.id, gameId));
	return row ? { game: row.game, role: row.role } : null;
}

/** Permissions that only read: a request holding one of these writes nothing to the game. */
const READS: ReadonlySet<Permission> = new Set(['team.read', 'game.read', 'release.read']);

/**
 * The caller's role in a game's team, if it allows `permission`; 401, 403 or 404 otherwise (404
 * for games of other teams). Read once per request: the layout and the page share it. A write
 * permission means the caller is about to change the game, so later reads in the same request
 * read it afresh (or take the game the write handed back, see `keepSavedGame`).
 */
export async function requireGameRole(db: Db, locals: App.Locals, gameId: string, permission: Permission): Promise<GameAccess> {
	const user = requireUser(locals);
	const entry = requestGame(db, locals, user, gameId);
	const found = await entry.access;
	if (!found?.role) error(404, 'No such game');
	const role = found.role;
	if (!may(role, permission)) error(403, `A ${role} may not do this`);
	if (!READS.has(permission)) perRequest.get(locals)?.delete(gameId);
	return { user, role, game: found.game };
}

/** As requireGameRole, with the whole game document (read once per request). */
export async function requireGame(db: Db, locals: App.Locals, gameId: string, permission: Permission): Promise<GameAccess & { doc: Game }> {
	const access = await requireGameRole(db, locals, gameId, permission);
	const entry = requestGame(db, locals, access.user, gameId);
	entry.doc ??= loadGame(db, gameId, access.game);
	return { ...access, doc: await entry.doc };
}

/** After a save: the game as written is what the rest of this request reads. */
export function keepSavedGame(locals: App.Locals, access: GameAccess, saved: Game): void {
	const game = { ...access.game, version: saved.version ?? access.game.version };
	const games_ = perRequest.get(locals) ?? new Map<string, RequestGame>();
	perRequest.set(locals, games_);
	games_.set(game.id, { access: Promise.resolve({ role: access.role, game }), doc: Promise.resolve(saved) });
}
