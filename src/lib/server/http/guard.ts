/**
 * Authorisation in one place. Every load, action and API handler asks `requireRole` (or
 * `requireUser`) before it reads or writes; what each role may do is the table in ../access.ts.
 * A person who is not a member of the team gets 404, so other teams' ids reveal nothing.
 */
import type { Db } from '../db';
import type { Role } from '../db/schema';
import { keptGame } from '../game-store';
import { gameAccess, may, roleIn, type GameRow, type Permission, type SignedIn } from '../access';
import { gameActorOf, teamActorOf, type GameActor, type TeamActor } from '../actor';
export { actorOf } from '../actor';
import { NotAllowed, NotFound, SignInFirst } from '../refusals';
import { refusedPage } from './answers';
import type { Game } from '$lib/game/model';

export { PERMISSIONS, may, type Permission, type SignedIn } from '../access';
export type { Actor, GameActor, TeamActor } from '../actor';

export function requireUser(locals: App.Locals): SignedIn {
	if (!locals.user) refusedPage(new SignInFirst());
	return locals.user;
}

/** The caller's role in the team, if it allows `permission`; 401, 403 or 404 otherwise. */
export async function requireRole(
	db: Db,
	locals: App.Locals,
	teamId: string,
	permission: Permission
): Promise<{ user: SignedIn; role: Role; actor: TeamActor }> {
	const user = requireUser(locals);
	const role = await roleIn(db, user.id, teamId);
	if (!role) refusedPage(new NotFound('No such team'));
	if (!may(role, permission)) refusedPage(new NotAllowed(`A ${role} may not do this`));
	return { user, role, actor: teamActorOf(user, teamId, role) };
}

/** What a game request knows of its caller: who, their role, the game row, and the actor game services take. */
export interface GameAccess {
	user: SignedIn;
	role: Role;
	game: GameRow;
	actor: GameActor;
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
		entry = { access: gameAccess(db, user.id, gameId) };
		games_.set(gameId, entry);
	}
	return entry;
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
	if (!found?.role) refusedPage(new NotFound('No such game'));
	const role = found.role;
	if (!may(role, permission)) refusedPage(new NotAllowed(`A ${role} may not do this`));
	if (!READS.has(permission)) perRequest.get(locals)?.delete(gameId);
	return { user, role, game: found.game, actor: gameActorOf(user, role, found.game) };
}

/** As requireGameRole, with the whole game document (read once per request). */
export async function requireGame(db: Db, locals: App.Locals, gameId: string, permission: Permission): Promise<GameAccess & { doc: Game }> {
	const access = await requireGameRole(db, locals, gameId, permission);
	const entry = requestGame(db, locals, access.user, gameId);
	entry.doc ??= keptGame(db, access.game);
	return { ...access, doc: await entry.doc };
}

/** After a save: the game as written is what the rest of this request reads. */
export function keepSavedGame(locals: App.Locals, access: GameAccess, saved: Game): void {
	const game = { ...access.game, version: saved.version ?? access.game.version };
	const games_ = perRequest.get(locals) ?? new Map<string, RequestGame>();
	perRequest.set(locals, games_);
	games_.set(game.id, { access: Promise.resolve({ role: access.role, game }), doc: Promise.resolve(saved) });
}
