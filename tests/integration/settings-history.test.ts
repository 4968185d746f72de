/**
 * The game's settings (rogue runner, race rules) in the history like any object: each save is a
 * version with who and which fields changed, the History page lists them, and an earlier
 * version can be restored as a new one, version-checked (409 from a stale page).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openWorld, fakeEvent, actorIn, type World, type Who } from './harness';
import { loadGame, saveSettings } from '$lib/server/game-store';
import { historyOf } from '$lib/server/history';
import * as historyApi from '../../src/routes/api/v1/games/[gameId=id]/history/+server';
import * as restoreApi from '../../src/routes/api/v1/games/[gameId=id]/history/[versionId=id]/restore/+server';
import * as historyPage from '../../src/routes/(app)/games/[gameId=id]/history/+page.server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
}, 240_000);
afterAll(async () => w?.close());

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const ev = (who: Who, call: Parameters<typeof fakeEvent>[1]) => fakeEvent(w.callers[who], call) as any;

async function restore(who: Who, versionId: string, version: number | null) {
	const res = await restoreApi.POST(ev(who, { method: 'POST', params: { gameId: w.gameId, versionId }, json: { version } }));
	return { status: res.status, body: (await res.json()) as { restored?: { version: number; restoredFrom: number; collection: string } } };
}

/** The settings' version: the rogue runner carries it. */
const settingsVersion = async () => (await loadGame(w.db, w.gameId)).rogueRunner!.version!;

describe('game settings in the history', () => {
	it('records a settings save with who and which fields changed', async () => {
		const game = await loadGame(w.db, w.gameId);
		expect(game.rogueRunner).toBeTruthy();
		const before = game.rogueRunner!;
		const { version } = await saveSettings(w.db, actorIn(w, 'designer'), { settings: { rogueRunner: { ...before, name: 'Renamed rogue' } }, baseVersion: before.version! });
		expect(version).toBe(before.version! + 1);
		const res = await historyApi.GET(ev('reviewer', { params: { gameId: w.gameId }, path: '/?collection=settings' }));
		expect(res.status).toBe(200);
		const { history } = (await res.json()) as { history: { collection: string; label: string; version: number; action: string; by: string; changes: { field: string; before: unknown; after: unknown }[] }[] };
		expect(history[0]).toMatchObject({ collection: 'settings', label: 'Game settings', version, action: 'saved', by: w.callers.designer!.name });
		expect(history[0].changes).toEqual([{ field: 'rogueRunner.name', before: before.name, after: 'Renamed rogue' }]);
		// The seed is on record as the first version.
		expect(history.at(-1)).toMatchObject({ version: 1, action: 'saved' });
		// The game's whole history lists it too, and the History page opens it.
		expect((await historyOf(w.db, w.gameId, { limit: 20 })).some((e) => e.collection === 'settings')).toBe(true);
		const page = (await historyPage.load(ev('designer', { params: { gameId: w.gameId }, path: '/?object=settings:settings' }))) as {
			object: { label: string; currentVersion: number };
			mayRestore: boolean;
		};
		expect(page.object).toMatchObject({ label: 'Game settings', currentVersion: version });
		expect(page.mayRestore).toBe(true);
	});

	it('restores an earlier version of the settings as a new version', async () => {
		const now = await settingsVersion();
		const first = (await historyOf(w.db, w.gameId, { collection: 'settings', limit: 500 })).at(-1)!;
		const { status, body } = await restore('designer', first.id, now);
		expect(status).toBe(201);
		expect(body.restored).toMatchObject({ collection: 'settings', version: now + 1, restoredFrom: 1 });
		const game = await loadGame(w.db, w.gameId);
		expect(game.rogueRunner!.name).not.toBe('Renamed rogue');
		expect(game.rogueRunner!.version).toBe(now + 1);
		const [latest] = await historyOf(w.db, w.gameId, { collection: 'settings', limit: 1 });
		expect(latest).toMatchObject({ action: 'restored', restoredFrom: 1, version: now + 1 });
	});

	it('refuses a stale restore (409), and one by who may not edit (403), changing nothing', async () => {
		const seen = await settingsVersion();
		const first = (await historyOf(w.db, w.gameId, { collection: 'settings', limit: 500 })).at(-1)!;
		const game = await loadGame(w.db, w.gameId);
		await saveSettings(w.db, actorIn(w, 'designer'), { settings: { rogueRunner: { ...game.rogueRunner!, name: 'Saved in another tab' } }, baseVersion: seen });
		expect((await restore('designer', first.id, seen)).status).toBe(409);
		expect((await restore('artist', first.id, seen + 1)).status).toBe(403);
		expect((await restore('outsider', first.id, seen + 1)).status).toBe(404);
		expect((await loadGame(w.db, w.gameId)).rogueRunner!.name).toBe('Saved in another tab');
	});
});
