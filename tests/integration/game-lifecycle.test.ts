/**
 * Deleting and duplicating a game: a copy owns its data and art; a delete needs the game's name,
 * takes the proofs and the files nobody else uses, tells the printers of a release, and leaves
 * other teams' callers with a 404 and nothing changed.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { Jimp } from 'jimp';
import { openWorld, fakeEvent, type World, type Who, actorIn } from './harness';
import { loadGame, applyChanges } from '$lib/server/game-store';
import { cutProof, releaseProof } from '$lib/server/proofs';
import { uploadArt } from '$lib/server/art-uploads';
import { artVersions, caughtMail, games, proofs } from '$lib/server/db/schema';
import { storage, artKey } from '$lib/server/storage';
import * as gameApi from '../../src/routes/api/v1/games/[gameId=id]/+server';
import * as duplicateApi from '../../src/routes/api/v1/games/[gameId=id]/duplicate/+server';
import * as deletePage from '../../src/routes/(app)/games/[gameId=id]/delete/+page.server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const ev = (who: Who, call: Parameters<typeof fakeEvent>[1]) => fakeEvent(w.callers[who], call) as any;
const gameRow = async (id: string) => (await w.db.select().from(games).where(eq(games.id, id)))[0];

async function duplicate(who: Who, gameId = w.gameId) {
	const res = await duplicateApi.POST(ev(who, { method: 'POST', params: { gameId } }));
	return { status: res.status, body: (await res.json()) as { game: { id: string; name: string } } };
}

async function until<T>(read: () => Promise<T>, ok: (v: T) => boolean): Promise<T> {
	for (let i = 0; i < 100; i++) {
		const v = await read();
		if (ok(v)) return v;
		await new Promise((r) => setTimeout(r, 100));
	}
	return read();
}

describe('duplicating a game', () => {
	it('makes a new game of the team with its own copy of the data and art', async () => {
		const original = await loadGame(w.db, w.gameId);
		const { status, body } = await duplicate('designer');
		expect(status).toBe(201);
		expect(body.game.name).toBe(`${original.name} (copy)`);
		const copy = await loadGame(w.db, body.game.id);
		expect(copy.cards.map((c) => c.id)).toEqual(original.cards.map((c) => c.id));
		expect(copy.art.map((a) => a.sha256).sort()).toEqual(original.art.map((a) => a.sha256).sort());
		expect((await gameRow(body.game.id)).teamId).toBe(w.teamId);
		// Its own rows: every art piece has its own version history in the copy.
		const versions = await w.db.select().from(artVersions).where(eq(artVersions.gameId, body.game.id));
		expect(versions.length).toBe(copy.art.length);

		// Changing the copy leaves the original alone.
		const runner = copy.runners[0];
		await applyChanges(w.db, actorIn(w, 'designer', body.game.id), { changes: [{ collection: 'runner', id: runner.id, baseVersion: runner.version, object: { ...runner, name: 'Copy only' } }], action: 'test' });
		expect((await loadGame(w.db, w.gameId)).runners[0].name).toBe(original.runners[0].name);
	});

	it('copies a game whose saves left a problem (a save warns of it, so the copy keeps it)', async () => {
		const { body } = await duplicate('designer');
		const source = await loadGame(w.db, body.game.id);
		// One more runner: a money table without a row for the new last place now has a problem; the
		// runner's save warns of it and is kept.
		const { version: _v, ...runner } = source.runners[0];
		await applyChanges(w.db, actorIn(w, 'designer', body.game.id), { changes: [{ collection: 'runner', id: 'rn-extra', baseVersion: null, object: { ...runner, id: 'rn-extra', name: 'Extra', sortOrder: 99 } }], action: 'test' });
		const again = await duplicate('designer', body.game.id);
		expect(again.status).toBe(201);
		expect((await loadGame(w.db, again.body.game.id)).runners.map((r) => r.id)).toContain('rn-extra');
	});

	it('answers 404 to another team and makes nothing', async () => {
		const before = (await w.db.select().from(games)).length;
		expect((await duplicate('outsider')).status).toBe(404);
		expect((await w.db.select().from(games)).length).toBe(before);
	});
});

describe('deleting a game', () => {
	it('refuses without the exact name and deletes nothing', async () => {
		const res = await gameApi.DELETE(ev('owner', { method: 'DELETE', params: { gameId: w.gameId }, json: { confirm: 'not the name' } }));
		expect(res.status).toBe(400);
		expect(((await res.json()) as { error: { message: string } }).error.message).toMatch(/Type the game's name exactly/);
		expect(await gameRow(w.gameId)).toBeTruthy();
		const page = await deletePage.actions.default(ev('owner', { params: { gameId: w.gameId }, form: { confirm: '' } }));
		expect(page.status).toBe(400);
		expect(await gameRow(w.gameId)).toBeTruthy();
	});

	it("answers 404 to another team's caller and 403 to a designer, and changes nothing", async () => {
		const name = (await gameRow(w.gameId)).name;
		for (const [who, want] of [['outsider', 404], ['designer', 403], ['printer', 403]] as const) {
			const res = await gameApi.DELETE(ev(who, { method: 'DELETE', params: { gameId: w.gameId }, json: { confirm: name } }));
			expect(res.status).toBe(want);
		}
		expect(await gameRow(w.gameId)).toBeTruthy();
		expect((await loadGame(w.db, w.gameId)).cards.length).toBeGreaterThan(0);
	});

	it('takes proofs and unused files with it, keeps files another game uses, and tells the printers', async () => {
		const { body } = await duplicate('owner');
		const copyId = body.game.id;
		// Art only the copy has.
		const png = await new Jimp({ width: 16, height: 16, color: 0x123456ff }).getBuffer('image/png');
		const uploaded = await uploadArt(w.db, actorIn(w, 'artist', copyId), { bytes: new Uint8Array(png), fileName: 'only-in-copy.png' });
		const own = uploaded.game.art.find((a) => a.fileName === 'only-in-copy.png')!.sha256;
		const shared = (await loadGame(w.db, w.gameId)).art[0].sha256;
		expect(await storage().has(artKey(own))).toBe(true);
		const p = await cutProof(w.db, actorIn(w, 'designer', copyId), { description: 'to be deleted' });
		await releaseProof(w.db, actorIn(w, 'designer'), { proof: p });

		const res = await gameApi.DELETE(ev('owner', { method: 'DELETE', params: { gameId: copyId }, path: `/?confirm=${encodeURIComponent(body.game.name)}` }));
		expect(res.status).toBe(200);
		expect(await gameRow(copyId)).toBeUndefined();
		expect(await w.db.select().from(proofs).where(eq(proofs.gameId, copyId))).toEqual([]);
		expect(await storage().has(artKey(own))).toBe(false);
		expect(await storage().has(artKey(shared))).toBe(true);

		const mail = await until(
			() => w.db.select().from(caughtMail).where(and(eq(caughtMail.to, 'printer@paddock.test'))),
			(m) => m.some((x) => x.subject.includes('was deleted'))
		);
		const told = mail.find((x) => x.subject.includes('was deleted'))!;
		expect(told.subject).toContain(body.game.name);
		expect(told.text).toContain(`proof ${p.number}`);

		// Gone means gone: a second delete is a 404.
		const again = await gameApi.DELETE(ev('owner', { method: 'DELETE', params: { gameId: copyId }, json: { confirm: body.game.name } }));
		expect(again.status).toBe(404);
	});
});
