/**
 * A game's end and its copies. Deleting takes the game with everything it holds (objects, proofs,
 * reviews, print jobs) and the stored files nothing else still needs; printers who were given a
 * release are told, since the files they hold are of a game that is gone. Duplicating makes a new
 * game of the same team from the game as a bundle would carry it: its data and its art.
 */
import { and, eq, inArray, isNotNull, sql } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from './db';
import { artFiles, artVersions, games, gameObjects, memberships, printJobs, proofs, users, type Role } from './db/schema';
import { loadGame } from './game-store';
import { Invalid, NotFound } from './refusals';
import { createGameFrom } from './game-io';
import { readArtFile } from './art-files';
import { logActivity } from './activity';
import { storage, artKey } from './storage';
import { sendMail } from './mail';
import { config } from './config';
import type { Game as GameRow } from './games';
import type { GameActor } from './actor';


/** The typed confirmation: the game's name, as the page shows it. */
export const DeleteGameSchema = z.strictObject({ confirm: z.string().trim().max(200) });

const sameName = (typed: string, name: string) => typed.trim().normalize('NFC') === name.trim().normalize('NFC');

/** Files still named by some row after the game's rows went: those stay. */
async function artStillUsed(db: Db, sha256: string): Promise<boolean> {
	const [version] = await db.select({ n: sql<number>`1` }).from(artVersions).where(eq(artVersions.sha256, sha256)).limit(1);
	if (version) return true;
	const [object] = await db
		.select({ n: sql<number>`1` })
		.from(gameObjects)
		.where(and(eq(gameObjects.collection, 'art'), sql`${gameObjects.data}->>'sha256' = ${sha256}`))
		.limit(1);
	if (object) return true;
	// A proof keeps the exact files it was cut with.
	const [proof] = await db.select({ n: sql<number>`1` }).from(proofs).where(sql`position(${sha256} in ${proofs.snapshot}::text) > 0`).limit(1);
	return !!proof;
}

/**
 * Deletes the game when `confirm` is its name. Refused (400) when it is not, so a slip deletes
 * nothing. Mail and file removal come after the rows are gone: a failure there leaves no game
 * half-deleted, only a file or a message short.
 */
export async function deleteGame(db: Db, actor: GameActor, input: z.infer<typeof DeleteGameSchema>) {
	const [game] = await db.select().from(games).where(eq(games.id, actor.gameId));
	if (!game) throw new NotFound('No such game');
	if (!sameName(input.confirm, game.name)) {
		throw new Invalid(`Type the game's name exactly (${game.name}) to delete it. Nothing was deleted.`);
	}
	const shas = (await db.selectDistinct({ sha256: artVersions.sha256 }).from(artVersions).where(eq(artVersions.gameId, game.id))).map((r) => r.sha256);
	const printKeys = (
		await db
			.selectDistinct({ key: printJobs.fileKey })
			.from(printJobs)
			.where(and(eq(printJobs.gameId, game.id), isNotNull(printJobs.fileKey)))
	).map((r) => r.key!);
	const released = await db
		.select({ number: proofs.number })
		.from(proofs)
		.where(and(eq(proofs.gameId, game.id), isNotNull(proofs.releasedAt)));
	// Every printer of the team once a release went out, muted or not: this is about files they hold.
	const printers: { email: string }[] = released.length
		? await db
				.select({ email: users.email })
				.from(memberships)
				.innerJoin(users, eq(users.id, memberships.userId))
				.where(and(eq(memberships.teamId, game.teamId), eq(memberships.role, 'printer' satisfies Role)))
		: [];

	await db.transaction(async (tx) => {
		await tx.delete(games).where(eq(games.id, game.id));
		await logActivity(tx as unknown as Db, {
			teamId: game.teamId,
			gameId: null,
			userId: actor.userId,
			action: 'game.deleted',
			detail: { name: game.name, proofs: released.length }
		});
	});

	const unused = [];
	for (const sha256 of shas) if (!(await artStillUsed(db, sha256))) unused.push(sha256);
	if (unused.length) await db.delete(artFiles).where(inArray(artFiles.sha256, unused));
	for (const sha256 of unused) {
		await storage().remove(artKey(sha256));
		await storage().remove(artKey(sha256, '.thumb.png'));
	}
	for (const key of printKeys) {
		const [other] = await db.select({ id: printJobs.id }).from(printJobs).where(eq(printJobs.fileKey, key)).limit(1);
		if (!other) await storage().remove(key);
	}

	const numbers = released.map((r) => r.number).sort((a, b) => a - b);
	for (const email of new Set(printers.map((p) => p.email))) {
		await sendMail(email, 'game-deleted', {
			author: actor.name,
			game: game.name,
			proofs: numbers.map((n) => `proof ${n}`).join(', '),
			link: new URL(`/teams/${game.teamId}`, config.origin).toString()
		});
	}
	return { name: game.name, teamId: game.teamId, filesRemoved: unused.length };
}

/** A new game of the same team with its own copy of the game's data and art, named as a copy. */
export async function duplicateGame(db: Db, actor: GameActor): Promise<GameRow> {
	const game = await loadGame(db, actor.gameId);
	const art = new Map<string, Uint8Array>();
	for (const asset of game.art) if (!art.has(asset.sha256)) art.set(asset.sha256, await readArtFile(asset.sha256));
	const row = await createGameFrom(db, { teamId: actor.teamId, userId: actor.userId, game: { ...game, name: copyName(game.name) }, art }, { keepProblems: true });
	await logActivity(db, { teamId: actor.teamId, gameId: row.id, userId: actor.userId, action: 'game.duplicated', detail: { from: game.name } });
	return row;
}

const COPY_SUFFIX = ' (copy)';

function copyName(name: string): string {
	return name.length + COPY_SUFFIX.length <= 80 ? name + COPY_SUFFIX : name.slice(0, 80 - COPY_SUFFIX.length).trimEnd() + COPY_SUFFIX;
}

/** What deleting the game takes with it, for the page that asks. */
export async function whatGoes(db: Db, gameId: string) {
	const game = await loadGame(db, gameId);
	const rows = await db.select({ releasedAt: proofs.releasedAt }).from(proofs).where(eq(proofs.gameId, gameId));
	return {
		cards: game.cards.length,
		art: game.art.length,
		proofs: rows.length,
		released: rows.filter((r) => r.releasedAt).length
	};
}
