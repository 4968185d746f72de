/** Rows of the role × route table: the history of a game's objects and restoring a version. */
import type { Row } from '../role-table';
import { as, g, readers, designers, game } from '../role-table';
import { statusOf, type World } from '../harness';
import { historyOf } from '$lib/server/history';
import * as historyApi from '../../../src/routes/api/v1/games/[gameId=id]/history/+server';
import * as restoreApi from '../../../src/routes/api/v1/games/[gameId=id]/history/[versionId=id]/restore/+server';
import * as historyPage from '../../../src/routes/(app)/games/[gameId=id]/history/+page.server';

/** The first recorded version of the game's first runner, and the runner's version now. */
async function firstRunnerVersion(w: World) {
	const runner = (await game(w)).runners[0];
	const first = (await historyOf(w.db, w.gameId, { collection: 'runner', objectId: runner.id, limit: 500 })).at(-1)!;
	return { versionId: first.id, version: runner.version! };
}

export const rows: Row[] = [
	{
		route: 'GET /api/v1/games/{gameId}/history',
		run: (w, who) => statusOf(() => historyApi.GET(as(w, who, { params: g(w) }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'POST /api/v1/games/{gameId}/history/{versionId}/restore',
		run: async (w, who) => {
			const { versionId, version } = await firstRunnerVersion(w);
			return statusOf(() => restoreApi.POST(as(w, who, { method: 'POST', params: g(w, { versionId }), json: { version } })));
		},
		expect: { ...designers, owner: 201, designer: 201, default: 403 }
	},
	{
		route: 'load /games/{gameId}/history',
		run: (w, who) => statusOf(() => historyPage.load(as(w, who, { params: g(w) }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'load /games/{gameId}/history?object=',
		run: async (w, who) => {
			const runner = (await game(w)).runners[0];
			return statusOf(() => historyPage.load(as(w, who, { params: g(w), path: `/?object=runner:${runner.id}` })));
		},
		expect: { ...readers, default: 200 }
	},
	{
		route: 'action /games/{gameId}/history?/restore',
		run: async (w, who) => {
			const { versionId, version } = await firstRunnerVersion(w);
			return statusOf(() => historyPage.actions.restore(as(w, who, { params: g(w), form: { versionId, version: String(version) } })));
		},
		expect: { ...designers, owner: 303, designer: 303, default: 403 }
	}
];
