/**
 * The role × route table's pieces: each area lists its rows (route, how to call it, the status
 * each caller should get) in role-rows/, and roles.test.ts walks them all.
 */
import { randomUUID } from 'node:crypto';
import { fakeEvent, type World, type Who, actorIn } from './harness';
import { loadGame, applyChanges } from '$lib/server/game-store';

export type Row = {
	route: string;
	run: (w: World, who: Who) => Promise<number>;
	expect: Partial<Record<Who, number>> & { default: number };
};

export const as = (w: World, who: Who, call: Parameters<typeof fakeEvent>[1] = {}) =>
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	fakeEvent(w.callers[who], call) as any;

export const signedIn = { anonymous: 401 };
export const members = { anonymous: 401, outsider: 404 };
export const onlyOwner = { owner: 200, designer: 403, artist: 403, printer: 403, reviewer: 403, ...members };
/** Everyone who reads the working game (printers see releases only). */
export const readers = { owner: 200, designer: 200, artist: 200, printer: 403, reviewer: 200, ...members };
export const designers = { owner: 200, designer: 200, artist: 403, printer: 403, reviewer: 403, ...members };
export const artEditors = { ...designers, artist: 200 };
/** Form actions that redirect (303) when allowed. */
export const editors = { owner: 303, designer: 303, artist: 403, printer: 403, reviewer: 403, ...members };

export const game = (w: World) => loadGame(w.db, w.gameId);
export const g = (w: World, extra: Record<string, string> = {}) => ({ gameId: w.gameId, ...extra });

/** A throw-away money table, made by the designer, for a caller to delete. */
export async function scratchTable(w: World) {
	const id = `scratch-${randomUUID()}`;
	await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'moneyTable', id, baseVersion: null, object: { id, name: id, rows: [], otherCoins: 0 } }], action: 'test' });
	return id;
}
