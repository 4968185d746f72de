/**
 * Every API route and form action × every role, plus anonymous callers and a member of another
 * team: the status each gets. The expected table follows the role list in the product brief.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { openWorld, fakeEvent, statusOf, EVERYONE, type World, type Who } from './harness';
import { createUser } from '$lib/server/users';
import { memberships } from '$lib/server/db/schema';

import * as me from '../../src/routes/api/v1/me/+server';
import * as teamsApi from '../../src/routes/api/v1/teams/+server';
import * as gamesApi from '../../src/routes/api/v1/teams/[teamId=id]/games/+server';
import * as membersApi from '../../src/routes/api/v1/teams/[teamId=id]/members/+server';
import * as memberApi from '../../src/routes/api/v1/teams/[teamId=id]/members/[userId=id]/+server';
import * as invitationsApi from '../../src/routes/api/v1/teams/[teamId=id]/invitations/+server';
import * as fallbackApi from '../../src/routes/api/[...rest]/+server';
import * as teamPage from '../../src/routes/(app)/teams/[teamId=id]/+page.server';
import * as membersPage from '../../src/routes/(app)/teams/[teamId=id]/members/+page.server';
import * as newTeamPage from '../../src/routes/(app)/teams/new/+page.server';
import * as gamePage from '../../src/routes/(app)/games/[gameId=id]/+page.server';
import * as accountPage from '../../src/routes/(app)/account/+page.server';
import * as mailPage from '../../src/routes/(app)/mail/+page.server';
import * as gameApi from '../../src/routes/api/v1/games/[gameId=id]/+server';
import * as collectionApi from '../../src/routes/api/v1/games/[gameId=id]/[collection=collection]/+server';
import * as objectApi from '../../src/routes/api/v1/games/[gameId=id]/[collection=collection]/[objectId]/+server';
import * as bundleApi from '../../src/routes/api/v1/games/[gameId=id]/bundle.zip/+server';
import * as importApi from '../../src/routes/api/v1/teams/[teamId=id]/games/import/+server';
import * as deckApi from '../../src/routes/api/v1/games/[gameId=id]/deck-check/+server';
import * as settingsApi from '../../src/routes/api/v1/games/[gameId=id]/settings/+server';
import { loadGame, applyChanges } from '$lib/server/game-store';
import { exportBundle } from '$lib/server/game-io';

let world: World;
let bundle: Uint8Array;
beforeAll(async () => {
	world = await openWorld();
	bundle = (await exportBundle(world.db, world.gameId)).zip;
});
afterAll(async () => world?.close());

type Row = {
	route: string;
	run: (w: World, who: Who) => Promise<number>;
	expect: Partial<Record<Who, number>> & { default: number };
};

const as = (w: World, who: Who, call: Parameters<typeof fakeEvent>[1] = {}) =>
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	fakeEvent(w.callers[who], call) as any;

const signedIn = { anonymous: 401 };
const members = { anonymous: 401, outsider: 404 };
const onlyOwner = { owner: 200, designer: 403, artist: 403, printer: 403, reviewer: 403, ...members };
const readers = { owner: 200, designer: 200, artist: 200, printer: 403, reviewer: 200, ...members };
const designers = { owner: 200, designer: 200, artist: 403, printer: 403, reviewer: 403, ...members };
const artEditors = { ...designers, artist: 200 };
const game = (w: World) => loadGame(w.db, w.gameId);
const g = (w: World, extra: Record<string, string> = {}) => ({ gameId: w.gameId, ...extra });

/** A throw-away money table, made by the designer, for a caller to delete. */
async function scratchTable(w: World) {
	const id = `scratch-${randomUUID()}`;
	await applyChanges(w.db, w.gameId, [{ collection: 'moneyTable', id, baseVersion: null, object: { id, name: id, rows: [], otherCoins: 0 } }], {
		userId: w.callers.designer!.id,
		teamId: w.teamId,
		action: 'test'
	});
	return id;
}

const editors = { owner: 303, designer: 303, artist: 403, printer: 403, reviewer: 403, ...members };

const ROWS: Row[] = [
	{ route: 'GET /api/v1/me', run: (w, who) => statusOf(() => me.GET(as(w, who))), expect: { default: 200, ...signedIn } },
	{ route: 'GET /api/v1/teams', run: (w, who) => statusOf(() => teamsApi.GET(as(w, who))), expect: { default: 200, ...signedIn } },
	{
		route: 'GET /api/v1/teams/{teamId}/games',
		run: (w, who) => statusOf(() => gamesApi.GET(as(w, who, { params: { teamId: w.teamId } }))),
		expect: { default: 200, ...members }
	},
	{
		route: 'POST /api/v1/teams/{teamId}/games',
		run: (w, who) =>
			statusOf(() => gamesApi.POST(as(w, who, { params: { teamId: w.teamId }, json: { name: `Game by ${who}` } }))),
		expect: { default: 403, owner: 201, designer: 201, ...members }
	},
	{
		route: 'GET /api/v1/teams/{teamId}/members',
		run: (w, who) => statusOf(() => membersApi.GET(as(w, who, { params: { teamId: w.teamId } }))),
		expect: { default: 200, ...members }
	},
	{
		route: 'POST /api/v1/teams/{teamId}/invitations',
		run: (w, who) =>
			statusOf(() =>
				invitationsApi.POST(
					as(w, who, { params: { teamId: w.teamId }, json: { email: `new-${who}-${randomUUID()}@x.test`, role: 'artist' } })
				)
			),
		expect: { ...onlyOwner, owner: 201, default: 403 }
	},
	{
		route: 'PATCH /api/v1/teams/{teamId}/members/{userId}',
		run: (w, who) =>
			statusOf(() =>
				memberApi.PATCH(
					as(w, who, { method: 'PATCH', params: { teamId: w.teamId, userId: w.callers.reviewer!.id }, json: { role: 'reviewer' } })
				)
			),
		expect: { ...onlyOwner, default: 403 }
	},
	{
		route: 'DELETE /api/v1/teams/{teamId}/members/{userId}',
		run: async (w, who) => {
			const temp = await createUser(w.db, { email: `temp-${randomUUID()}@x.test`, name: 'Temp', password: 'temporary-pass-1' });
			await w.db.insert(memberships).values({ teamId: w.teamId, userId: temp.id, role: 'reviewer' });
			return statusOf(() => memberApi.DELETE(as(w, who, { method: 'DELETE', params: { teamId: w.teamId, userId: temp.id } })));
		},
		expect: { ...onlyOwner, default: 403 }
	},
	{ route: 'GET /api/v1/unknown', run: (w, who) => statusOf(async () => fallbackApi.GET()), expect: { default: 404 } },
	{
		route: 'load /teams/{teamId}',
		run: (w, who) => statusOf(() => teamPage.load(as(w, who, { params: { teamId: w.teamId } }))),
		expect: { default: 200, ...members }
	},
	{
		route: 'action /teams/{teamId}?/createGame',
		run: (w, who) =>
			statusOf(() =>
				teamPage.actions.createGame(
					as(w, who, { params: { teamId: w.teamId }, form: { name: `Form game ${who}`, bleedStandard: 'us', defaultCardSize: 'mini' } })
				)
			),
		expect: { ...editors, default: 403 }
	},
	{
		route: 'load /teams/{teamId}/members',
		run: (w, who) => statusOf(() => membersPage.load(as(w, who, { params: { teamId: w.teamId } }))),
		expect: { default: 200, ...members }
	},
	{
		route: 'load /games/{gameId}',
		run: (w, who) => statusOf(() => gamePage.load(as(w, who, { params: { gameId: w.gameId } }))),
		expect: { default: 200, ...members }
	},
	{ route: 'load /account', run: (w, who) => statusOf(() => accountPage.load(as(w, who))), expect: { default: 200, ...signedIn } },
	{
		route: 'action /account?/createToken',
		run: (w, who) => statusOf(() => accountPage.actions.createToken(as(w, who, { form: { name: 'script' } }))),
		expect: { default: 200, ...signedIn }
	},
	{
		route: 'action /account?/revokeToken (someone else’s or unknown id)',
		run: (w, who) => statusOf(() => accountPage.actions.revokeToken(as(w, who, { form: { id: randomUUID() } }))),
		expect: { default: 404, ...signedIn }
	},
	{
		route: 'load /mail',
		run: (w, who) => statusOf(() => mailPage.load(as(w, who))),
		// Owners read caught mail (the outsider owns a team of their own); only their teams' messages.
		expect: { default: 403, owner: 200, outsider: 200, anonymous: 401 }
	},
	{
		route: 'GET /api/v1/games/{gameId}',
		run: (w, who) => statusOf(() => gameApi.GET(as(w, who, { params: g(w) }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'GET /api/v1/games/{gameId}/cards',
		run: (w, who) => statusOf(() => collectionApi.GET(as(w, who, { params: g(w, { collection: 'cards' }) }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'POST /api/v1/games/{gameId}/money-tables',
		run: (w, who) =>
			statusOf(() =>
				collectionApi.POST(
					as(w, who, { params: g(w, { collection: 'money-tables' }), json: { name: `Table by ${who}`, rows: [{ place: 1, coins: 5 }], otherCoins: -1 } })
				)
			),
		expect: { ...designers, owner: 201, designer: 201, default: 403 }
	},
	{
		route: 'PUT /api/v1/games/{gameId}/runners/{id}',
		run: async (w, who) => {
			const runner = (await game(w)).runners[0];
			return statusOf(() =>
				objectApi.PUT(as(w, who, { method: 'PUT', params: g(w, { collection: 'runners', objectId: runner.id }), json: { ...runner, name: `${runner.name.slice(0, 20)} ${who}` } }))
			);
		},
		expect: { ...designers, default: 403 }
	},
	{
		route: 'PUT /api/v1/games/{gameId}/art/{id} (status, assignment)',
		run: async (w, who) => {
			const art = (await game(w)).art[0];
			return statusOf(() =>
				objectApi.PUT(as(w, who, { method: 'PUT', params: g(w, { collection: 'art', objectId: art.id }), json: { ...art, status: 'sketch' } }))
			);
		},
		expect: { ...artEditors, default: 403 }
	},
	{
		route: 'DELETE /api/v1/games/{gameId}/money-tables/{id}',
		run: async (w, who) => {
			const id = await scratchTable(w);
			return statusOf(() =>
				objectApi.DELETE(as(w, who, { method: 'DELETE', path: '/?version=1', params: g(w, { collection: 'money-tables', objectId: id }) }))
			);
		},
		expect: { ...designers, default: 403 }
	},
	{
		route: 'GET /api/v1/games/{gameId}/bundle.zip',
		run: (w, who) => statusOf(() => bundleApi.GET(as(w, who, { params: g(w) }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'GET /api/v1/games/{gameId}/deck-check',
		run: (w, who) => statusOf(() => deckApi.GET(as(w, who, { params: g(w) }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'PUT /api/v1/games/{gameId}/settings',
		run: async (w, who) => {
			const rogue = (await game(w)).rogueRunner!;
			return statusOf(() =>
				settingsApi.PUT(as(w, who, { method: 'PUT', params: g(w), json: { version: rogue.version, rogueRunner: rogue } }))
			);
		},
		expect: { ...designers, default: 403 }
	},
	{
		route: 'POST /api/v1/teams/{teamId}/games/import',
		run: (w, who) =>
			statusOf(() =>
				importApi.POST(as(w, who, { params: { teamId: w.teamId }, body: bundle, headers: { 'content-type': 'application/zip' } }))
			),
		expect: { ...designers, owner: 201, designer: 201, default: 403 }
	},
	// These make every caller the owner of a new team, so they come last.
	{
		route: 'POST /api/v1/teams',
		run: (w, who) => statusOf(() => teamsApi.POST(as(w, who, { json: { name: `Team of ${who}` } }))),
		expect: { default: 201, ...signedIn }
	},
	{
		route: 'action /teams/new',
		run: (w, who) => statusOf(() => newTeamPage.actions.default(as(w, who, { form: { name: `New ${who}` } }))),
		expect: { default: 303, ...signedIn }
	}
];

describe('role × route table', () => {
	for (const row of ROWS) {
		describe(row.route, () => {
			for (const who of EVERYONE) {
				const want = row.expect[who] ?? row.expect.default;
				it(`${who} → ${want}`, async () => {
					expect(await row.run(world, who)).toBe(want);
				});
			}
		});
	}
});
