/**
 * A game's objects in the database, assembled into the `Game` of src/lib/game/model.ts and
 * saved back one object at a time. Every save names the version it was based on; a save from
 * a stale form is refused (409) and the newer data kept. Every change is checked against the
 * whole game (references between objects) before it is written.
 */
import { and, asc, eq, max, sql } from 'drizzle-orm';
import { LRUCache } from 'lru-cache';
import { z } from 'zod';
import type { Db } from './db';
import { games, gameObjects, gameSettings, objectVersions, SETTINGS_OBJECT_ID, type Collection } from './db/schema';
import {
	ArtAssetSchema,
	CardKindSchema,
	CardSchema,
	GAME_FORMAT_VERSION,
	MoneyTableSchema,
	RaceRulesSchema,
	RogueRunnerSchema,
	RunnerSchema,
	findReferenceProblems,
	validateMoneyTable,
	CARD_SIZES,
	cardSize,
	type Game
} from '$lib/game/model';
import { logActivity } from './activity';
import type { GameRow } from './access';
import type { GameActor } from './actor';
import type { ReadinessItem } from '$lib/game/readiness';
import { NotFound, Conflict, Invalid } from './refusals';

export const OBJECT_SCHEMAS = {
	runner: RunnerSchema,
	moneyTable: MoneyTableSchema,
	kind: CardKindSchema,
	card: CardSchema,
	art: ArtAssetSchema
} as const satisfies Record<Collection, z.ZodType>;

export type ObjectOf<C extends Collection> = z.infer<(typeof OBJECT_SCHEMAS)[C]>;

/** Where each collection sits in the Game document. */
export const COLLECTION_FIELD: Record<Collection, 'runners' | 'moneyTables' | 'kinds' | 'cards' | 'art'> = {
	runner: 'runners',
	moneyTable: 'moneyTables',
	kind: 'kinds',
	card: 'cards',
	art: 'art'
};

/** What people call each collection, for messages. */
const NOUN: Record<Collection, string> = {
	runner: 'runner',
	moneyTable: 'money table',
	kind: 'card kind',
	card: 'card',
	art: 'art piece'
};

/** Game-wide settings: the rogue runner and the race rules the odds lab plays by. */
export const SettingsSchema = z.strictObject({ rogueRunner: RogueRunnerSchema.optional(), raceRules: RaceRulesSchema.optional() });
type Settings = z.infer<typeof SettingsSchema>;

/** One object of a game, by collection and id. */
const objectWhere = (gameId: string, collection: Collection, id: string) =>
	and(eq(gameObjects.gameId, gameId), eq(gameObjects.collection, collection), eq(gameObjects.id, id));

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type Conn = Db | Tx;

/** The document's fields that come from the game row itself. */
const rowFields = (game: GameRow) => ({
	name: game.name,
	slug: game.slug,
	bleedStandard: game.bleedStandard,
	defaultSize: defaultSizeOf(game.defaultCardSize),
	version: game.version
});

/** The whole game as one document, each object carrying its row version (`row`: the game row, when read already). */
export async function loadGame(db: Conn, gameId: string, row?: GameRow): Promise<Game> {
	const [game] = row ? [row] : await db.select().from(games).where(eq(games.id, gameId));
	if (!game) throw new NotFound('No such game');
	const [settings] = await db.select().from(gameSettings).where(eq(gameSettings.gameId, gameId));
	const rows = await db
		.select()
		.from(gameObjects)
		.where(eq(gameObjects.gameId, gameId))
		.orderBy(asc(gameObjects.position), asc(gameObjects.id));
	const { version, ...fields } = rowFields(game);
	const doc: Game = {
		formatVersion: GAME_FORMAT_VERSION,
		...fields,
		runners: [],
		moneyTables: [],
		kinds: [],
		cards: [],
		art: [],
		version
	};
	const stored = settings ? SettingsSchema.parse(settings.data) : {};
	// The rogue runner is saved with the settings, so it carries their version.
	if (stored.rogueRunner) doc.rogueRunner = { ...stored.rogueRunner, version: settings!.version };
	if (stored.raceRules) doc.raceRules = stored.raceRules;
	for (const row of rows) {
		(doc[COLLECTION_FIELD[row.collection]] as unknown[]).push({ ...row.data, version: row.version });
	}
	return doc;
}

/** Game documents read lately, by game and version (`keptGame`), bounded by bytes (lru-cache). */
export const GAME_CACHE_BYTES = 16 * 1024 * 1024;
const keptGames = new LRUCache<string, Game>({ maxSize: GAME_CACHE_BYTES, maxEntrySize: GAME_CACHE_BYTES / 4 });

/** What the game-document cache holds now (for the benchmark). */
export const gameCacheStats = () => ({ entries: keptGames.size, bytes: keptGames.calculatedSize, maxBytes: GAME_CACHE_BYTES });

/**
 * The game as `loadGame` reads it, for a request that has just read the game row (`row`) and
 * reads the game outside a transaction. Every write of a game's objects or settings bumps the
 * row's version in its own transaction (`touchGame`; an import writes the row and its content in
 * one), so the objects and settings read once at a version are the game's at that version; the
 * row's own fields (name, sizes) are taken from `row`. Each caller gets a copy of its own.
 */
export async function keptGame(db: Db, row: GameRow): Promise<Game> {
	const key = `${row.id}:${row.version}`;
	let doc = keptGames.get(key);
	if (!doc) {
		doc = await loadGame(db, row.id, row);
		// JavaScript strings take up to two bytes a character: a rough size of the document in memory.
		keptGames.set(key, doc, { size: JSON.stringify(doc).length * 2 });
	}
	return { ...structuredClone(doc), ...rowFields(row) };
}

/** The game's default card size from its preset name (poker when the name is unknown). */
function defaultSizeOf(preset: string): Game['defaultSize'] {
	return preset in CARD_SIZES ? cardSize(preset as keyof typeof CARD_SIZES) : cardSize('poker');
}

/** Problems that would break the game: broken references, money tables missing a place. */
export function gameProblems(game: Game): string[] {
	const problems = findReferenceProblems(game).map((p) => p.message);
	for (const table of game.moneyTables) problems.push(...tableErrors(game, table.id).map((p) => p.message));
	return problems;
}

function tableErrors(game: Game, tableId: string) {
	const table = game.moneyTables.find((t) => t.id === tableId);
	if (!table || game.runners.length === 0) return [];
	return validateMoneyTable(table, game.runners.length).problems.filter((p) => p.severity === 'error');
}

/**
 * What refuses a save, and what only warns. A save is refused for its own objects' problems
 * (a money table missing a place, a reference to something missing); a problem it causes in
 * another object (a new runner leaves a table one place short) is a warning naming that object.
 */
function saveVerdict(game: Game, changes: Change[]): { refusals: string[]; warnings: ReadinessItem[] } {
	const refusals = findReferenceProblems(game).map((p) => p.message);
	const warnings: ReadinessItem[] = [];
	const saved = new Set(changes.filter((c) => c.collection === 'moneyTable' && !c.remove).map((c) => c.id));
	for (const table of game.moneyTables) {
		const errors = tableErrors(game, table.id);
		if (saved.has(table.id)) refusals.push(...errors.map((p) => p.message));
		else warnings.push(...errors.map((p) => ({ code: 'table-gap' as const, message: p.message, ref: { collection: 'moneyTable' as const, id: table.id } })));
	}
	return { refusals, warnings };
}

function parseObject<C extends Collection>(collection: C, value: unknown): ObjectOf<C> {
	const parsed = OBJECT_SCHEMAS[collection].safeParse(value);
	if (!parsed.success) {
		throw new Invalid(parsed.error.issues
				.slice(0, 5)
				.map((i) => `${i.path.join('.') || collection}: ${i.message}`)
				.join('; ')
		);
	}
	return parsed.data as ObjectOf<C>;
}

function stripVersion<T extends { version?: number }>(obj: T): Omit<T, 'version'> {
	const { version: _version, ...rest } = obj;
	return rest;
}

async function touchGame(tx: Conn, gameId: string) {
	await tx
		.update(games)
		.set({ version: sql`${games.version} + 1`, updatedAt: new Date() })
		.where(eq(games.id, gameId));
}

export interface Change {
	collection: Collection;
	/** The object to write; absent with `remove`. */
	object?: unknown;
	id: string;
	/** The version the caller saw; null for a new object; undefined skips the check (imports). */
	baseVersion?: number | null;
	remove?: boolean;
	/** Set when the change brings back an earlier version (from the history). */
	restoredFrom?: number;
}

/**
 * Applies changes in one transaction: each is validated, version-checked and written; then the
 * game as a whole is checked. Anything wrong and nothing is written.
 */
export async function applyChanges(
	db: Db,
	by: GameActor,
	{ changes, action }: { changes: Change[]; action: string }
): Promise<Game & { saveWarnings: ReadinessItem[] }> {
	const { gameId } = by;
	return db.transaction(async (tx) => {
		for (const change of changes) {
			const [row] = await tx
				.select()
				.from(gameObjects)
				.where(
					objectWhere(gameId, change.collection, change.id)
				)
				.for('update');
			if (change.baseVersion !== undefined) {
				if (change.baseVersion === null && row) {
					throw new Conflict(`A ${NOUN[change.collection]} with id ${change.id} exists already`, {
						...row.data,
						version: row.version
					});
				}
				if (change.baseVersion !== null && !row) {
					// A restore of something deleted since the person looked: their view is stale, not the object missing.
					if (change.restoredFrom !== undefined) {
						throw new Conflict(`This ${NOUN[change.collection]} was deleted after you opened its history (you saw version ${change.baseVersion}). Reload the history to restore it as a deleted ${NOUN[change.collection]}.`);
					}
					throw new NotFound(`No ${NOUN[change.collection]} with id ${change.id}`);
				}
				if (row && change.baseVersion !== null && row.version !== change.baseVersion) {
					throw new Conflict(`Someone saved this ${NOUN[change.collection]} after you opened it (your version ${change.baseVersion}, now ${row.version}). Your changes were not saved; reload to see theirs.`,
						{ ...row.data, version: row.version }
					);
				}
			}
			const record = (version: number, action: 'saved' | 'deleted' | 'restored', data: Record<string, unknown>) =>
				tx.insert(objectVersions).values({
					gameId,
					collection: change.collection,
					objectId: change.id,
					version,
					action,
					restoredFrom: change.restoredFrom ?? null,
					data,
					changedBy: by.userId
				});
			if (change.remove) {
				if (!row) throw new NotFound(`No ${NOUN[change.collection]} with id ${change.id}`);
				await tx
					.delete(gameObjects)
					.where(
						objectWhere(gameId, change.collection, change.id)
					);
				// Kept in the history, so a delete can be undone by restoring it.
				await record(row.version, 'deleted', row.data);
				continue;
			}
			const object = parseObject(change.collection, change.object);
			if (object.id !== change.id) throw new Invalid('The id in the body differs from the id in the path');
			const data = stripVersion(object) as Record<string, unknown>;
			const how = change.restoredFrom !== undefined ? 'restored' : 'saved';
			if (row) {
				await tx
					.update(gameObjects)
					.set({ data, version: row.version + 1, updatedBy: by.userId, updatedAt: new Date() })
					.where(
						objectWhere(gameId, change.collection, change.id)
					);
				await record(row.version + 1, how, data);
			} else {
				const [{ last }] = await tx
					.select({ last: max(gameObjects.position) })
					.from(gameObjects)
					.where(and(eq(gameObjects.gameId, gameId), eq(gameObjects.collection, change.collection)));
				// An object brought back after a delete carries on its numbering, so versions never repeat.
				const [{ before }] = await tx
					.select({ before: max(objectVersions.version) })
					.from(objectVersions)
					.where(and(eq(objectVersions.gameId, gameId), eq(objectVersions.collection, change.collection), eq(objectVersions.objectId, change.id)));
				const version = (before ?? 0) + 1;
				await tx.insert(gameObjects).values({
					gameId,
					collection: change.collection,
					id: change.id,
					position: (last ?? -1) + 1,
					data,
					version,
					updatedBy: by.userId
				});
				await record(version, how, data);
			}
		}
		const game = await loadGame(tx, gameId);
		const { refusals: problems, warnings } = saveVerdict(game, changes);
		if (problems.length) {
			throw new Invalid(problems.slice(0, 5).join('; ') + (problems.length > 5 ? ` (and ${problems.length - 5} more)` : ''));
		}
		await touchGame(tx, gameId);
		await logActivity(tx as unknown as Db, {
			teamId: by.teamId,
			gameId,
			userId: by.userId,
			action,
			detail: { changes: changes.length, ids: changes.slice(0, 20).map((c) => `${c.collection}:${c.id}`) }
		});
		return { ...game, version: game.version! + 1, saveWarnings: warnings };
	});
}

/** Settings as stored: no versions inside, absent keys left out. */
const storedSettings = (s: Settings) => ({
	...(s.rogueRunner ? { rogueRunner: stripVersion(s.rogueRunner) } : {}),
	...(s.raceRules ? { raceRules: s.raceRules } : {})
});

/**
 * Changes the game's settings, version-checked like an object. Each key given replaces the stored
 * one (given as undefined: removed); keys not given are kept, so the rogue runner's form and the
 * race rules' form do not undo each other. Answers the settings' new version and the game as saved.
 */
export async function saveSettings(
	db: Db,
	by: GameActor,
	{ settings, baseVersion, restoredFrom }: { settings: Settings; baseVersion: number | null; restoredFrom?: number }
): Promise<{ version: number; game: Game }> {
	const { gameId } = by;
	return db.transaction(async (tx) => {
		const [row] = await tx.select().from(gameSettings).where(eq(gameSettings.gameId, gameId)).for('update');
		const current = row?.version ?? 0;
		if (baseVersion !== null && baseVersion !== current) {
			throw new Conflict('Someone changed these settings after you opened them; reload to see theirs.');
		}
		const merged = storedSettings({ ...(row ? SettingsSchema.parse(row.data) : {}), ...settings });
		if (row) {
			await tx.update(gameSettings).set({ data: merged, version: current + 1 }).where(eq(gameSettings.gameId, gameId));
		} else {
			await tx.insert(gameSettings).values({ gameId, data: merged, version: 1 });
		}
		// Recorded in the history like an object's save, so settings show there and can be restored.
		await tx.insert(objectVersions).values({
			gameId,
			collection: 'settings',
			objectId: SETTINGS_OBJECT_ID,
			version: current + 1,
			action: restoredFrom !== undefined ? 'restored' : 'saved',
			restoredFrom: restoredFrom ?? null,
			data: merged,
			changedBy: by.userId
		});
		const game = await loadGame(tx, gameId);
		const problems = findReferenceProblems(game).map((p) => p.message);
		if (problems.length) throw new Invalid(problems.slice(0, 5).join('; '));
		await touchGame(tx, gameId);
		await logActivity(tx as unknown as Db, {
			teamId: by.teamId,
			gameId,
			userId: by.userId,
			action: restoredFrom !== undefined ? 'settings.restored' : 'game.settings'
		});
		// The game as written too, so the caller answers from it rather than reading it again.
		return { version: current + 1, game: { ...game, version: game.version! + 1 } };
	});
}

/** Writes a whole game document into an existing (empty) game: the import and seed path. */
export async function writeGameContent(db: Db, gameId: string, game: Game, userId: string | null) {
	await db.transaction(async (tx) => {
		if (game.rogueRunner || game.raceRules) {
			const data = storedSettings({ rogueRunner: game.rogueRunner, raceRules: game.raceRules });
			await tx.insert(gameSettings).values({ gameId, data });
			await tx.insert(objectVersions).values({ gameId, collection: 'settings', objectId: SETTINGS_OBJECT_ID, version: 1, action: 'saved', data, changedBy: userId });
		}
		const rows = (Object.keys(COLLECTION_FIELD) as Collection[]).flatMap((collection) =>
			(game[COLLECTION_FIELD[collection]] as { id: string; version?: number }[]).map((obj, position) => ({
				gameId,
				collection,
				id: obj.id,
				position,
				data: stripVersion(obj) as Record<string, unknown>,
				updatedBy: userId
			}))
		);
		for (let i = 0; i < rows.length; i += 200) await tx.insert(gameObjects).values(rows.slice(i, i + 200));
		// The history starts with the game as it arrived.
		const first = rows.map((r) => ({ gameId, collection: r.collection, objectId: r.id, version: 1, action: 'saved' as const, data: r.data, changedBy: userId }));
		for (let i = 0; i < first.length; i += 200) await tx.insert(objectVersions).values(first.slice(i, i + 200));
	});
}
