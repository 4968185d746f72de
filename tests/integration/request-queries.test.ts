/**
 * How many database queries one request makes: a game tab (the signed-in layout, the game's
 * layout and the page, sharing one request as SvelteKit runs them) and a form save. The game's
 * access (caller, role, game row) is read once per request, and a save hands back the game it
 * wrote. Counted at the database client, so every query counts, transactions included.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fakeEvent, openWorld, superformJson, type World } from './harness';
import { loadGame } from '$lib/server/game-store';
import * as appLayout from '../../src/routes/(app)/+layout.server';
import * as gameLayout from '../../src/routes/(app)/games/[gameId=id]/+layout.server';
import * as tablesPage from '../../src/routes/(app)/games/[gameId=id]/money-tables/+page.server';
import * as runnersPage from '../../src/routes/(app)/games/[gameId=id]/runners/+page.server';
import * as kindPage from '../../src/routes/(app)/games/[gameId=id]/kinds/[kindId]/+page.server';
import { withSaved } from '$lib/components/save-in-place';
import * as objectApi from '../../src/routes/api/v1/games/[gameId=id]/[collection=collection]/[objectId]/+server';
import * as settingsApi from '../../src/routes/api/v1/games/[gameId=id]/settings/+server';
import type { Card } from '$lib/game/model';

type Query = (...args: unknown[]) => Promise<unknown>;
/** Transaction brackets are the driver's, not the request's: PGlite sends none through `query`. */
const BRACKET = /^\s*(begin|commit|rollback|savepoint|release)\b/i;

/** Counts every statement the database client sends: embedded PGlite or a PostgreSQL pool. */
function countQueries(db: unknown) {
	const wrap = (target: { query: Query }) => {
		const query = target.query.bind(target);
		target.query = (...a: unknown[]) => {
			const text = typeof a[0] === 'string' ? a[0] : (a[0] as { text?: string })?.text ?? '';
			if (!BRACKET.test(text)) queries++;
			return query(...a);
		};
	};
	const client = (db as { $client: { query: Query; transaction?: Query; connect?: (...a: unknown[]) => unknown } }).$client;
	const wrapped = new WeakSet<object>();
	const watch = <T extends object>(conn: T): T => {
		if (conn && !wrapped.has(conn)) (wrapped.add(conn), wrap(conn as unknown as { query: Query }));
		return conn;
	};
	if (!client.connect) {
		// Embedded: one client, and a transaction hands out its own.
		wrap(client);
		if (client.transaction) {
			const transaction = client.transaction.bind(client);
			client.transaction = (fn) => transaction((tx: object) => (fn as (tx: unknown) => Promise<unknown>)(watch(tx)));
		}
		return;
	}
	// A pool: every statement runs on one of its connections (the pool's own `query` checks one out
	// with a callback), so each connection is counted once, however it was checked out.
	const connect = client.connect.bind(client);
	client.connect = (...a: unknown[]) => {
		const done = a[0] as ((err: unknown, conn: object, release: unknown) => void) | undefined;
		if (typeof done === 'function') return connect((err: unknown, conn: object, release: unknown) => done(err, conn && watch(conn), release));
		return (connect() as Promise<object>).then(watch);
	};
}

let world: World;
let queries = 0;
beforeAll(async () => {
	world = await openWorld();
	countQueries(world.db);
});
afterAll(async () => world?.close());

async function counted(run: () => Promise<unknown>): Promise<number> {
	const before = queries;
	await run();
	return queries - before;
}

/** One request's event: every load of the request gets the same `locals`. */
function request(path: string, extra: Parameters<typeof fakeEvent>[1] = {}) {
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	return fakeEvent(world.callers.designer, { path, params: { gameId: world.gameId }, ...extra }) as any;
}

describe('queries per request', () => {
	it('a game tab load reads the game once', async () => {
		const event = request(`/games/${world.gameId}/money-tables`);
		const n = await counted(() => Promise.all([appLayout.load(event), gameLayout.load(event), tablesPage.load(event)]));
		// The caller's teams; the game row with the caller's role; the game's settings and objects.
		expect(n).toBeLessThanOrEqual(4);
	});

	it('a form save writes and reads back in one pass', async () => {
		const runner = (await loadGame(world.db, world.gameId)).runners[1];
		const event = request(`/games/${world.gameId}/runners?/save`, { form: superformJson({ ...runner, name: 'Renamed' }) });
		const n = await counted(() => runnersPage.actions.save(event));
		// Access; in the transaction: the row, its update, its history row, the game read back whole, its
		// version, the log line.
		expect(n).toBeLessThanOrEqual(9);
	});

	it('a save followed by the page in the same request reads nothing again', async () => {
		const runner = (await loadGame(world.db, world.gameId)).runners[2];
		const event = request(`/games/${world.gameId}/runners?/save`, { form: superformJson({ ...runner, name: 'Renamed again' }) });
		await runnersPage.actions.save(event);
		let page: Awaited<ReturnType<typeof runnersPage.load>> | undefined;
		const n = await counted(async () => {
			[, page] = await Promise.all([gameLayout.load(event), runnersPage.load(event)]);
		});
		expect(n).toBe(0);
		expect(page!.runners.find((r) => r.id === runner.id)).toMatchObject({ name: 'Renamed again', version: runner.version! + 1 });
		expect((await gameLayout.load(event)).game.version).toBe((await loadGame(world.db, world.gameId)).version);
	});

	it('a card save answers what the page shows, so the browser loads nothing after it', async () => {
		const game = await loadGame(world.db, world.gameId);
		const card = game.cards.find((c) => c.data.type === 'movement')!;
		const kindId = card.kindId;
		const params = { gameId: world.gameId, kindId };
		const path = `/games/${world.gameId}/kinds/${kindId}?card=${card.id}`;
		// The page as the browser holds it before the save.
		const shown = await kindPage.load(fakeEvent(world.callers.designer, { path, params }) as never);
		const save = fakeEvent(world.callers.designer, { path: `${path}&/saveCard`, params, form: superformJson({ ...card, copies: card.copies + 2 }) });
		let answer: { form: { data: Card; message: { tone: string } }; saved: Card } | undefined;
		const n = await counted(async () => {
			answer = (await kindPage.actions.saveCard(save as never)) as never;
		});
		// The same bound as any object save: the answer costs no extra read.
		expect(n).toBeLessThanOrEqual(9);
		expect(answer!.saved).toMatchObject({ id: card.id, copies: card.copies + 2, version: card.version! + 1 });
		// The form carries the new version: the next save from it is checked against the saved card.
		expect(answer!.form.data).toEqual(answer!.saved);
		expect(answer!.form.message.tone).not.toBe('error');
		// The page's list with the answer applied is what a fresh load would show.
		const fresh = await kindPage.load(fakeEvent(world.callers.designer, { path, params }) as never);
		expect(withSaved(shown.cards, answer!.saved)).toEqual(fresh.cards);
		// And the next save from the answered form goes through (no false conflict).
		const again = fakeEvent(world.callers.designer, { path: `${path}&/saveCard`, params, form: superformJson({ ...answer!.form.data, copies: card.copies }) });
		const second = (await kindPage.actions.saveCard(again as never)) as unknown as { saved: Card };
		expect(second.saved).toMatchObject({ copies: card.copies, version: card.version! + 2 });
	});

	it('a stale save still meets the conflict', async () => {
		const game = await loadGame(world.db, world.gameId);
		const runner = game.runners[0];
		const stale = { ...runner, version: runner.version! - 1, name: 'Stale' };
		const event = request(`/games/${world.gameId}/runners?/save`, { form: superformJson(stale) });
		const answer = (await runnersPage.actions.save(event)) as unknown as { status: number; data: { form: { message: { tone: string } } } };
		expect(answer.status).toBe(409);
		expect(answer.data.form.message.tone).toBe('error');
	});

	it('the API answers a save with the object as written, read in the same pass', async () => {
		const runner = (await loadGame(world.db, world.gameId)).runners[3];
		const { version, ...body } = runner;
		const put = request(`/api/v1/games/${world.gameId}/runners/${runner.id}`, {
			method: 'PUT',
			params: { gameId: world.gameId, collection: 'runners', objectId: runner.id },
			json: { ...body, name: 'Renamed by script', version }
		});
		let res: Response | undefined;
		const n = await counted(async () => {
			res = await objectApi.PUT(put);
		});
		expect(n).toBeLessThanOrEqual(9);
		expect(res!.status).toBe(200);
		expect((await res!.json()).runner).toMatchObject({ id: runner.id, name: 'Renamed by script', version: version! + 1 });
	});

	it('the settings API answers the settings as written and their version for the next save', async () => {
		const game = await loadGame(world.db, world.gameId);
		const put = (version: number, name: string) =>
			settingsApi.PUT(
				request(`/api/v1/games/${world.gameId}/settings`, {
					method: 'PUT',
					json: { version, rogueRunner: { ...game.rogueRunner!, version: undefined, name } }
				})
			);
		const first = await put(game.rogueRunner!.version!, 'Rogue by script');
		expect(first.status).toBe(200);
		const answer = await first.json();
		expect(answer.settings.rogueRunner).toMatchObject({ name: 'Rogue by script', version: answer.version });
		expect((await put(answer.version, 'Rogue again')).status).toBe(200);
	});
});
