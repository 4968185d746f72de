/**
 * The game store: the demo game round-trips through the database, stale saves are refused and
 * keep the newer data, broken references are refused, and bundles import exactly.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openWorld, type World, actorIn } from './harness';
import { teamActorOf } from '$lib/server/actor';
import { eq } from 'drizzle-orm';
import { loadGame, applyChanges, keptGame } from '$lib/server/game-store';
import { Invalid } from '$lib/server/refusals';
import { exportBundle, importBundle } from '$lib/server/game-io';
import { demoGame } from '$lib/demo/demo';
import { BundleError } from '$lib/game/bundle';
import { games } from '$lib/server/db/schema';
import { zipSync, strToU8 } from 'fflate';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

const strip = <T>(g: T): T => JSON.parse(JSON.stringify(g, (k, v) => (k === 'version' ? undefined : v)));

describe('game store', () => {
	it('holds the demo game exactly as the model made it', async () => {
		const stored = await loadGame(w.db, w.gameId);
		const made = demoGame();
		expect(strip(stored.runners)).toEqual(strip(made.runners));
		expect(strip(stored.cards)).toEqual(strip(made.cards));
		expect(strip(stored.kinds)).toEqual(strip(made.kinds));
		expect(stored.rogueRunner?.name).toBe(made.rogueRunner?.name);
		expect(stored.art.length).toBeGreaterThan(0);
	});

	it('refuses a stale save and keeps the newer data', async () => {
		const game = await loadGame(w.db, w.gameId);
		const table = game.moneyTables[0];
		const v = table.version!;
		await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'moneyTable', id: table.id, baseVersion: v, object: { ...table, name: 'Tab one' } }], action: 'test' });
		const stale = applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'moneyTable', id: table.id, baseVersion: v, object: { ...table, name: 'Tab two' } }], action: 'test' });
		await expect(stale).rejects.toMatchObject({ reason: 'conflict' });
		const after = await loadGame(w.db, w.gameId);
		expect(after.moneyTables[0].name).toBe('Tab one');
		expect(after.moneyTables[0].version).toBe(v + 1);
	});

	it('refuses a change that breaks a reference, writing nothing', async () => {
		const before = await loadGame(w.db, w.gameId);
		const runner = before.runners[0];
		const removal = applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'runner', id: runner.id, baseVersion: runner.version!, remove: true }], action: 'test' });
		await expect(removal).rejects.toBeInstanceOf(Invalid);
		const after = await loadGame(w.db, w.gameId);
		expect(after.runners).toHaveLength(before.runners.length);
		expect(after.version).toBe(before.version);
	});

	it('exports a bundle that imports into another team as the same game', async () => {
		const { game, zip } = await exportBundle(w.db, w.gameId);
		const row = await importBundle(w.db, teamActorOf(w.callers.outsider!, w.outsiderTeamId, 'owner'), { zip });
		const copy = await loadGame(w.db, row.id);
		expect(strip({ ...copy, slug: 'x' })).toEqual(strip({ ...game, slug: 'x' }));
		const again = await exportBundle(w.db, row.id);
		expect(again.game.cards).toHaveLength(game.cards.length);
	});

	it('refuses a damaged or foreign zip and creates nothing', async () => {
		const { zip } = await exportBundle(w.db, w.gameId);
		const before = (await w.db.select().from(games)).length;
		const by = actorIn(w, 'designer');
		await expect(importBundle(w.db, by, { zip: zip.slice(0, zip.length - 100) })).rejects.toBeInstanceOf(BundleError);
		const foreign = zipSync({ 'readme.txt': strToU8('not a game') });
		await expect(importBundle(w.db, by, { zip: foreign })).rejects.toThrow(/game/i);
		expect((await w.db.select().from(games)).length).toBe(before);
	});
});

describe('art through the object API', () => {
	it('cannot point an art piece at another file, nor make one without an upload', async () => {
		const objectApi = await import('../../src/routes/api/v1/games/[gameId=id]/[collection=collection]/[objectId]/+server');
		const collectionApi = await import('../../src/routes/api/v1/games/[gameId=id]/[collection=collection]/+server');
		const { fakeEvent } = await import('./harness');
		const before = await loadGame(w.db, w.gameId);
		const art = before.art[0];
		const other = 'f'.repeat(64);
		// eslint-disable-next-line @typescript-eslint/no-explicit-any
		const ev = (call: Parameters<typeof fakeEvent>[1]) => fakeEvent(w.callers.artist, call) as any;
		const res = await objectApi.PUT(
			ev({ method: 'PUT', params: { gameId: w.gameId, collection: 'art', objectId: art.id }, json: { ...art, sha256: other, status: 'final' } })
		);
		expect(res.status).toBe(200);
		const after = (await loadGame(w.db, w.gameId)).art.find((a) => a.id === art.id)!;
		expect(after.sha256).toBe(art.sha256);
		expect(after.status).toBe('final');
		const made = await collectionApi.POST(ev({ params: { gameId: w.gameId, collection: 'art' }, json: { ...art, id: 'sneaky', sha256: other } }));
		expect(made.status).toBe(405);
	});
});

describe('games kept by version', () => {
	const rowNow = async () => (await w.db.select().from(games).where(eq(games.id, w.gameId)))[0];

	it('answers as the game is read, a copy of its own for each caller, and follows every save', async () => {
		const row = await rowNow();
		const kept = await keptGame(w.db, row);
		expect(kept).toEqual(await loadGame(w.db, w.gameId, row));
		kept.cards[0].name = 'Changed by one caller only';
		const again = await keptGame(w.db, row);
		expect(again.cards[0].name).not.toBe('Changed by one caller only');
		// A save bumps the game's version; at the new version the save is there.
		const table = again.moneyTables[0];
		await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'moneyTable', id: table.id, baseVersion: table.version!, object: { ...table, name: 'Kept table' } }], action: 'test' });
		const after = await rowNow();
		expect(after.version).toBeGreaterThan(row.version);
		const fresh = await keptGame(w.db, after);
		expect(fresh.moneyTables.find((t) => t.id === table.id)!.name).toBe('Kept table');
		expect(fresh).toEqual(await loadGame(w.db, w.gameId, after));
	});

	it("takes the row's own fields (name, size, version) from the row read now", async () => {
		const row = await rowNow();
		await keptGame(w.db, row);
		const renamed = await keptGame(w.db, { ...row, name: 'Renamed in the row only', defaultCardSize: 'bridge' });
		expect(renamed.name).toBe('Renamed in the row only');
		expect(renamed.defaultSize.preset).toBe('bridge');
		expect(renamed.version).toBe(row.version);
	});
});
