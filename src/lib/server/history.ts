/**
 * The history of a game's objects: every save, delete and restore, with who and when and which
 * fields changed; any version can be brought back, as a new version, through the same
 * version-checked save as an edit (a restore from a stale page is refused like a stale save).
 */
import { and, desc, eq, inArray } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from './db';
import { gameSettings, objectVersions, users, type HistoryCollection } from './db/schema';
import { COLLECTION_SEGMENTS, type CollectionSegment } from '$lib/schemas/collections';
import { applyChanges, COLLECTION_FIELD, loadGame, saveSettings, SettingsSchema } from './game-store';
import { NotFound } from './refusals';
import type { GameActor } from './actor';
import { fieldChanges, objectLabel, type FieldChange } from '$lib/game/history';

export type { HistoryCollection };

export interface HistoryEntry {
	id: string;
	collection: HistoryCollection;
	objectId: string;
	label: string;
	version: number;
	action: 'saved' | 'deleted' | 'restored';
	restoredFrom: number | null;
	by: string | null;
	at: Date;
	/** Against the object's previous version; empty for the first and for deletes. */
	changes: FieldChange[];
	/** True for the first version recorded of the object. */
	first: boolean;
}

/** The game's settings (rogue runner, race rules) as the history names them. */
export const SETTINGS_LABEL = 'Game settings';

/** `collection` as the API's URL segment (runners, money-tables, kinds, cards, art, settings). */
export const HistoryQuerySchema = z.object({
	collection: z
		.enum([...(Object.keys(COLLECTION_SEGMENTS) as CollectionSegment[]), 'settings'] as const)
		.transform((s): HistoryCollection => (s === 'settings' ? 'settings' : COLLECTION_SEGMENTS[s]))
		.optional(),
	objectId: z.string().min(1).max(100).optional(),
	limit: z.coerce.number().int().min(1).max(500).default(100)
});

/** `version`: the object's version the person saw (null when they saw it deleted). */
const SEEN_VERSION = 'Give "version": the version of the object you saw, as a whole number, or null when it is deleted.';
export const RestoreSchema = z.strictObject({ version: z.int({ error: SEEN_VERSION }).min(1, SEEN_VERSION).nullable() });

/** What to restore: one stored version, and the version of the object the caller saw. */
export type RestoreRequest = z.infer<typeof RestoreSchema> & { versionId: string };

type Row = typeof objectVersions.$inferSelect;

/** Newest first: the game's changes, or one object's. */
export async function historyOf(db: Db, gameId: string, query: z.infer<typeof HistoryQuerySchema>): Promise<HistoryEntry[]> {
	const where = [eq(objectVersions.gameId, gameId)];
	if (query.collection) where.push(eq(objectVersions.collection, query.collection));
	if (query.objectId) where.push(eq(objectVersions.objectId, query.objectId));
	const rows = await db
		.select({ v: objectVersions, by: users.name })
		.from(objectVersions)
		.leftJoin(users, eq(users.id, objectVersions.changedBy))
		.where(and(...where))
		.orderBy(desc(objectVersions.changedAt), desc(objectVersions.version))
		.limit(query.limit);
	const previous = await previousVersions(db, gameId, rows.map((r) => r.v));
	return rows.map(({ v, by }) => {
		const before = previous.get(v.id);
		return {
			id: v.id,
			collection: v.collection,
			objectId: v.objectId,
			label: v.collection === 'settings' ? SETTINGS_LABEL : objectLabel(v.data, v.objectId),
			version: v.version,
			action: v.action,
			restoredFrom: v.restoredFrom,
			by,
			at: v.changedAt,
			changes: v.action === 'deleted' || !before ? [] : fieldChanges(before.data, v.data),
			first: !before
		};
	});
}

/** For each row, the row recorded just before it for the same object. */
async function previousVersions(db: Db, gameId: string, rows: Row[]): Promise<Map<string, Row>> {
	const ids = [...new Set(rows.map((r) => r.objectId))];
	if (ids.length === 0) return new Map();
	const all = await db
		.select()
		.from(objectVersions)
		.where(and(eq(objectVersions.gameId, gameId), inArray(objectVersions.objectId, ids)))
		.orderBy(objectVersions.changedAt, objectVersions.version);
	const out = new Map<string, Row>();
	const last = new Map<string, Row>();
	for (const r of all) {
		const key = `${r.collection}:${r.objectId}`;
		const before = last.get(key);
		if (before) out.set(r.id, before);
		last.set(key, r);
	}
	return out;
}

/** One recorded version of an object of this game (404 for another game's). */
export async function versionOf(db: Db, gameId: string, versionId: string): Promise<Row> {
	const [row] = await db
		.select()
		.from(objectVersions)
		.where(and(eq(objectVersions.id, versionId), eq(objectVersions.gameId, gameId)));
	if (!row) throw new NotFound('No such version of anything in this game');
	return row;
}

/** The object as it is now, with its version; null when it is deleted. */
export async function currentOf(db: Db, gameId: string, collection: HistoryCollection, objectId: string) {
	if (collection === 'settings') return settingsNow(db, gameId);
	const game = await loadGame(db, gameId);
	return ((game[COLLECTION_FIELD[collection]] as { id: string; version?: number }[]).find((o) => o.id === objectId) ?? null) as
		| (Record<string, unknown> & { id: string; version?: number })
		| null;
}

/**
 * Brings back a recorded version as a new version of the object. `seen` is the version the
 * person had in front of them: when the object moved on since (or came back after a delete), the
 * restore is refused with 409 and nothing changes.
 */
export async function restoreVersion(db: Db, actor: GameActor, seen: RestoreRequest) {
	const row = await versionOf(db, actor.gameId, seen.versionId);
	if (row.collection === 'settings') {
		// Every key as it was then: one missing then is removed now.
		const then = SettingsSchema.parse(row.data);
		const { version } = await saveSettings(db, actor, {
			settings: { rogueRunner: then.rogueRunner, raceRules: then.raceRules },
			baseVersion: seen.version ?? 0,
			restoredFrom: row.version
		});
		return { collection: row.collection, objectId: row.objectId, restoredFrom: row.version, version, saveWarnings: [] };
	}
	const collection = row.collection;
	const object = { ...row.data, id: row.objectId };
	const game = await applyChanges(db, actor, {
		changes: [{ collection, id: row.objectId, baseVersion: seen.version, object, restoredFrom: row.version }],
		action: `${collection}.restored`
	});
	const restored = (game[COLLECTION_FIELD[collection]] as { id: string; version?: number }[]).find((o) => o.id === row.objectId)!;
	return { collection, objectId: row.objectId, restoredFrom: row.version, version: restored.version!, saveWarnings: game.saveWarnings };
}

/** The settings as stored now, with their version (0 before the first save). */
async function settingsNow(db: Db, gameId: string): Promise<Record<string, unknown> & { version: number }> {
	const [row] = await db.select().from(gameSettings).where(eq(gameSettings.gameId, gameId));
	return { ...(row?.data ?? {}), version: row?.version ?? 0 };
}
