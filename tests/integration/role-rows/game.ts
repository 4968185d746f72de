/** Rows of the role × route table: the game's data API. */
import type { Row } from '../role-table';
import { as, g, game, readers, designers, artEditors, scratchTable } from '../role-table';
import { statusOf } from '../harness';
import { exportBundle } from '$lib/server/game-io';
import * as gameApi from '../../../src/routes/api/v1/games/[gameId=id]/+server';
import * as collectionApi from '../../../src/routes/api/v1/games/[gameId=id]/[collection=collection]/+server';
import * as objectApi from '../../../src/routes/api/v1/games/[gameId=id]/[collection=collection]/[objectId]/+server';
import * as bundleApi from '../../../src/routes/api/v1/games/[gameId=id]/bundle.zip/+server';
import * as importApi from '../../../src/routes/api/v1/teams/[teamId=id]/games/import/+server';
import * as deckApi from '../../../src/routes/api/v1/games/[gameId=id]/deck-check/+server';
import * as settingsApi from '../../../src/routes/api/v1/games/[gameId=id]/settings/+server';

export const rows: Row[] = [
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
		run: async (w, who) =>
			statusOf(async () =>
				importApi.POST(as(w, who, { params: { teamId: w.teamId }, body: Buffer.from((await exportBundle(w.db, w.gameId)).zip), headers: { 'content-type': 'application/zip' } }))
			),
		expect: { ...designers, owner: 201, designer: 201, default: 403 }
	}
];
