/** Games of a team: listing and creating. The game's components live in later tables. */
import { and, eq, asc } from 'drizzle-orm';
import type { Db } from './db';
import { games } from './db/schema';
import { logActivity } from './activity';
import type { TeamActor } from './actor';

export type Game = typeof games.$inferSelect;

export function slugify(name: string): string {
	const slug = name
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 60);
	return slug || 'game';
}

export async function gamesOf(db: Db, teamId: string) {
	return db.select().from(games).where(eq(games.teamId, teamId)).orderBy(asc(games.name));
}

/** What a new game starts from. */
export interface NewGame {
	name: string;
	bleedStandard?: 'metric' | 'us';
	defaultCardSize?: string;
}

/** A member creates a game in their team. */
export function createGame(db: Db, actor: TeamActor, input: NewGame): Promise<Game> {
	return insertGame(db, { teamId: actor.teamId, userId: actor.userId }, input);
}

/**
 * Inserts the game row with a slug unique in its team (a suffix is added when taken). The seed,
 * imports and copies call it with the team and the person the game is logged for.
 */
export async function insertGame(db: Db, owner: { teamId: string; userId: string }, input: NewGame): Promise<Game> {
	const base = slugify(input.name);
	for (let n = 1; ; n++) {
		const slug = n === 1 ? base : `${base}-${n}`;
		const [taken] = await db
			.select({ id: games.id })
			.from(games)
			.where(and(eq(games.teamId, owner.teamId), eq(games.slug, slug)));
		if (taken) continue;
		const [game] = await db
			.insert(games)
			.values({
				teamId: owner.teamId,
				name: input.name.trim(),
				slug,
				bleedStandard: input.bleedStandard ?? 'metric',
				defaultCardSize: input.defaultCardSize ?? 'poker'
			})
			.returning();
		await logActivity(db, {
			teamId: owner.teamId,
			gameId: game.id,
			userId: owner.userId,
			action: 'game.created',
			detail: { name: game.name }
		});
		return game;
	}
}
