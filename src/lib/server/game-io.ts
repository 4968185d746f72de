/** Whole games in and out: the demo seed, bundle export and bundle import. */
import { eq } from 'drizzle-orm';
import type { Db } from './db';
import { artVersions } from './db/schema';
import { readBundle, writeBundle } from '$lib/game/bundle';
import type { Game } from '$lib/game/model';
import { insertGame, type Game as GameRow } from './games';
import type { TeamActor } from './actor';
import { loadGame, writeGameContent, gameProblems } from './game-store';
import { Invalid } from './refusals';
import { storeArtFile, readArtFile } from './art-files';
import { logActivity } from './activity';
import { inspectArt, ArtRejected, type InspectedArt } from '$lib/art/inspect';

/** Creates a game in the team from a whole document and its art bytes (by SHA-256). */
export async function createGameFrom(
	db: Db,
	input: { teamId: string; userId: string; game: Game; art: Map<string, Uint8Array> },
	/** A copy of a stored game keeps its problems, as its saves did (they warn, not refuse); an import must be whole. */
	options: { keepProblems?: boolean } = {}
): Promise<GameRow> {
	const problems = options.keepProblems ? [] : gameProblems(input.game);
	if (problems.length) throw new Invalid(`The game has problems: ${problems.slice(0, 5).join('; ')}`);
	for (const asset of input.game.art) {
		if (!input.art.has(asset.sha256)) throw new Invalid(`Art file ${asset.fileName} is missing`);
	}
	// The same inspection as an upload; the game keeps what the file is, not what the bundle says.
	const inspected = new Map<string, InspectedArt>();
	for (const asset of input.game.art) {
		if (inspected.has(asset.sha256)) continue;
		try {
			inspected.set(asset.sha256, await inspectArt(input.art.get(asset.sha256)!, asset.fileName));
		} catch (e) {
			if (e instanceof ArtRejected) throw new Invalid(`Art file ${asset.fileName} was refused: ${e.message}`);
			throw e;
		}
	}
	const game: Game = {
		...input.game,
		art: input.game.art.map((a) => {
			const file = inspected.get(a.sha256)!;
			const { dpiX: _x, dpiY: _y, ...rest } = a;
			return {
				...rest,
				mime: file.mime,
				widthPx: file.widthPx,
				heightPx: file.heightPx,
				...(file.dpiX !== undefined && { dpiX: file.dpiX }),
				...(file.dpiY !== undefined && { dpiY: file.dpiY })
			};
		})
	};
	// Files first: they are content-addressed, so a failed import leaves nothing that points at them.
	for (const file of inspected.values()) await storeArtFile(db, file);
	return db.transaction(async (tx) => {
		const t = tx as unknown as Db;
		const row = await insertGame(t, input, {
			name: input.game.name,
			bleedStandard: input.game.bleedStandard,
			defaultCardSize: input.game.defaultSize.preset === 'custom' ? 'poker' : input.game.defaultSize.preset
		});
		await writeGameContent(t, row.id, game, input.userId);
		if (game.art.length) {
			await tx.insert(artVersions).values(
				game.art.map((a) => ({
					gameId: row.id,
					artId: a.id,
					number: 1,
					sha256: a.sha256,
					fileName: a.fileName,
					uploadedBy: input.userId
				}))
			);
		}
		return row;
	});
}

export async function exportBundle(db: Db, gameId: string): Promise<{ game: Game; zip: Uint8Array }> {
	const game = await loadGame(db, gameId);
	const art = new Map<string, Uint8Array>();
	for (const asset of game.art) art.set(asset.sha256, await readArtFile(asset.sha256));
	return { game, zip: writeBundle(game, art) };
}

/** Imports a bundle as a new game of the team; a damaged or foreign zip throws BundleError. */
export async function importBundle(db: Db, actor: TeamActor, { zip }: { zip: Uint8Array }) {
	const { game, art } = readBundle(zip);
	const row = await createGameFrom(db, { teamId: actor.teamId, userId: actor.userId, game, art });
	await logActivity(db, { teamId: actor.teamId, gameId: row.id, userId: actor.userId, action: 'game.imported', detail: { name: game.name } });
	return row;
}

export async function artHistory(db: Db, gameId: string) {
	return db.select().from(artVersions).where(eq(artVersions.gameId, gameId));
}
