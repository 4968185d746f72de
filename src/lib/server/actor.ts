/**
 * Who acts: the second argument of every service that writes on someone's behalf, `(db, actor,
 * data)`. The guard (http/guard.ts) builds it once it has checked the caller's role; services
 * trust it and never look at the request. Work nobody asked for (seeding, a queued job) runs
 * without one.
 */
import type { Role } from './db/schema';

/** A signed-in person. */
export interface Actor {
	userId: string;
	name: string;
}

/** A person acting inside one team, with their role there. */
export interface TeamActor extends Actor {
	teamId: string;
	role: Role;
}

/** A person acting on one game of their team. */
export interface GameActor extends TeamActor {
	gameId: string;
}

interface Person {
	id: string;
	name: string;
}

export const actorOf = (user: Person): Actor => ({ userId: user.id, name: user.name });

export const teamActorOf = (user: Person, teamId: string, role: Role): TeamActor => ({ ...actorOf(user), teamId, role });

export const gameActorOf = (user: Person, role: Role, game: { id: string; teamId: string }): GameActor => ({
	...teamActorOf(user, game.teamId, role),
	gameId: game.id
});
