/**
 * An object's history: every save, delete and restore is kept with who, when and which fields
 * changed; a restore is a new version, a stale restore is refused like a stale save, and another
 * team's caller gets 404 and changes nothing.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openWorld, fakeEvent, type World, type Who, actorIn } from './harness';
import { applyChanges, loadGame } from '$lib/server/game-store';
import { historyOf } from '$lib/server/history';
import * as historyApi from '../../src/routes/api/v1/games/[gameId=id]/history/+server';
import * as restoreApi from '../../src/routes/api/v1/games/[gameId=id]/history/[versionId=id]/restore/+server';
import * as historyPage from '../../src/routes/(app)/games/[gameId=id]/history/+page.server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const ev = (who: Who, call: Parameters<typeof fakeEvent>[1]) => fakeEvent(w.callers[who], call) as any;

async function renameRunner(name: string) {
	const runner = (await loadGame(w.db, w.gameId)).runners[0];
	await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'runner', id: runner.id, baseVersion: runner.version, object: { ...runner, name } }], action: 'test' });
	return (await loadGame(w.db, w.gameId)).runners[0];
}

async function restore(who: Who, versionId: string, version: number | null, gameId = w.gameId) {
	const res = await restoreApi.POST(ev(who, { method: 'POST', params: { gameId, versionId }, json: { version } }));
	return { status: res.status, body: (await res.json()) as { restored?: { version: number; restoredFrom: number }; error?: { message: string } } };
}

describe('history and restore', () => {
	it('lists who changed what and which fields, newest first', async () => {
		const original = (await loadGame(w.db, w.gameId)).runners[0];
		await renameRunner('Mudlark Renamed');
		const res = await historyApi.GET(ev('reviewer', { params: { gameId: w.gameId }, path: `/?collection=runners&objectId=${original.id}` }));
		expect(res.status).toBe(200);
		const { history } = (await res.json()) as { history: { version: number; by: string; changes: { field: string; before: unknown; after: unknown }[]; action: string }[] };
		expect(history[0]).toMatchObject({ version: original.version! + 1, action: 'saved', by: w.callers.designer!.name });
		expect(history[0].changes).toEqual([{ field: 'name', before: original.name, after: 'Mudlark Renamed' }]);
		// The seed is the first version on record.
		expect(history.at(-1)!.version).toBe(1);
	});

	it('restores an earlier version as a new version, keeping the ones in between', async () => {
		const before = (await loadGame(w.db, w.gameId)).runners[0];
		const first = (await historyOf(w.db, w.gameId, { collection: 'runner', objectId: before.id, limit: 500 })).at(-1)!;
		const { status, body } = await restore('designer', first.id, before.version!);
		expect(status).toBe(201);
		expect(body.restored).toMatchObject({ version: before.version! + 1, restoredFrom: 1 });
		const after = (await loadGame(w.db, w.gameId)).runners[0];
		expect(after.name).toBe(first.label);
		const history = await historyOf(w.db, w.gameId, { collection: 'runner', objectId: before.id, limit: 500 });
		expect(history[0]).toMatchObject({ action: 'restored', restoredFrom: 1, version: before.version! + 1 });
		expect(history.some((h) => h.label === 'Mudlark Renamed')).toBe(true);
	});

	it('refuses a stale restore (409) and changes nothing', async () => {
		const now = (await loadGame(w.db, w.gameId)).runners[0];
		const first = (await historyOf(w.db, w.gameId, { collection: 'runner', objectId: now.id, limit: 500 })).at(-1)!;
		await renameRunner('Saved in another tab');
		const { status, body } = await restore('designer', first.id, now.version!);
		expect(status).toBe(409);
		expect(body.error!.message).toMatch(/after you opened it/);
		expect((await loadGame(w.db, w.gameId)).runners[0].name).toBe('Saved in another tab');
		// The page says the same in plain words.
		const page = await historyPage.actions.restore(ev('designer', { params: { gameId: w.gameId }, form: { versionId: first.id, version: String(now.version) } }));
		expect(page.status).toBe(409);
		expect(page.data.message).toMatch(/Nothing was restored/);
	});

	it('undoes a delete by restoring the deleted version', async () => {
		const id = 'history-table';
		await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'moneyTable', id, baseVersion: null, object: { id, name: 'Short-lived', rows: [], otherCoins: 0 } }], action: 'test' });
		const table = (await loadGame(w.db, w.gameId)).moneyTables.find((t) => t.id === id)!;
		await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'moneyTable', id, baseVersion: table.version, remove: true }], action: 'test' });
		const [deleted] = await historyOf(w.db, w.gameId, { collection: 'moneyTable', objectId: id, limit: 5 });
		expect(deleted.action).toBe('deleted');
		const { status, body } = await restore('owner', deleted.id, null);
		expect(status).toBe(201);
		// Numbering carries on: the comeback is version 2, never a second version 1.
		expect(body.restored!.version).toBe(2);
		expect((await loadGame(w.db, w.gameId)).moneyTables.find((t) => t.id === id)?.name).toBe('Short-lived');
		// Restoring it again as if it were still deleted is stale.
		expect((await restore('owner', deleted.id, null)).status).toBe(409);
	});

	it('a restore of something deleted since it was looked at is stale (409), and a missing version is named', async () => {
		const id = 'history-gone';
		await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'moneyTable', id, baseVersion: null, object: { id, name: 'Gone soon', rows: [], otherCoins: 0 } }], action: 'test' });
		const table = (await loadGame(w.db, w.gameId)).moneyTables.find((t) => t.id === id)!;
		const [saved] = await historyOf(w.db, w.gameId, { collection: 'moneyTable', objectId: id, limit: 5 });
		await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'moneyTable', id, baseVersion: table.version, remove: true }], action: 'test' });
		// The person still sees version 1 in front of them.
		const stale = await restore('designer', saved.id, table.version!);
		expect(stale.status).toBe(409);
		expect(stale.body.error!.message).toMatch(/deleted after you opened its history/);
		const missing = await restoreApi.POST(ev('designer', { method: 'POST', params: { gameId: w.gameId, versionId: saved.id }, json: {} }));
		expect(missing.status).toBe(400);
		expect(((await missing.json()) as { error: { message: string } }).error.message).toMatch(/null when it is deleted/);
		expect((await loadGame(w.db, w.gameId)).moneyTables.some((t) => t.id === id)).toBe(false);
	});

	it("answers 404 to another team's caller, 403 to those who may not edit it, and changes nothing", async () => {
		const now = (await loadGame(w.db, w.gameId)).runners[0];
		const first = (await historyOf(w.db, w.gameId, { collection: 'runner', objectId: now.id, limit: 500 })).at(-1)!;
		expect((await restore('outsider', first.id, now.version!)).status).toBe(404);
		// Another team's game id with this game's version: no such version there.
		expect((await restore('outsider', first.id, now.version!, '00000000-0000-4000-8000-000000000000')).status).toBe(404);
		expect((await restore('artist', first.id, now.version!)).status).toBe(403);
		expect((await restore('printer', first.id, now.version!)).status).toBe(403);
		expect((await historyApi.GET(ev('outsider', { params: { gameId: w.gameId } }))).status).toBe(404);
		expect((await loadGame(w.db, w.gameId)).runners[0]).toEqual(now);
	});
});
