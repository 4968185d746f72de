/** Rows of the role × route table: deleting and duplicating a game. */
import type { Row } from '../role-table';
import { as, g, onlyOwner, designers } from '../role-table';
import { actorIn, statusOf, type World } from '../harness';
import { createGame } from '$lib/server/games';
import * as gameApi from '../../../src/routes/api/v1/games/[gameId=id]/+server';
import * as duplicateApi from '../../../src/routes/api/v1/games/[gameId=id]/duplicate/+server';
import * as deletePage from '../../../src/routes/(app)/games/[gameId=id]/delete/+page.server';
import * as overviewPage from '../../../src/routes/(app)/games/[gameId=id]/+page.server';

/** A throw-away game of the team, so a caller allowed to delete deletes only it. */
async function scratchGame(w: World, who: string) {
	return createGame(w.db, actorIn(w, 'owner'), { name: `Scratch for ${who}` });
}

export const rows: Row[] = [
	{
		route: 'DELETE /api/v1/games/{gameId}',
		run: async (w, who) => {
			const game = await scratchGame(w, who);
			return statusOf(() => gameApi.DELETE(as(w, who, { method: 'DELETE', params: { gameId: game.id }, json: { confirm: game.name } })));
		},
		expect: { ...onlyOwner, default: 403 }
	},
	{
		route: 'POST /api/v1/games/{gameId}/duplicate',
		run: (w, who) => statusOf(() => duplicateApi.POST(as(w, who, { method: 'POST', params: g(w) }))),
		expect: { ...designers, owner: 201, designer: 201, default: 403 }
	},
	{
		route: 'load /games/{gameId}/delete',
		run: (w, who) => statusOf(() => deletePage.load(as(w, who, { params: g(w) }))),
		expect: { ...onlyOwner, default: 403 }
	},
	{
		route: 'action /games/{gameId}/delete',
		run: async (w, who) => {
			const game = await scratchGame(w, who);
			return statusOf(() => deletePage.actions.default(as(w, who, { params: { gameId: game.id }, form: { confirm: game.name } })));
		},
		expect: { ...onlyOwner, owner: 303, default: 403 }
	},
	{
		route: 'action /games/{gameId}?/duplicate',
		run: (w, who) => statusOf(() => overviewPage.actions.duplicate(as(w, who, { params: g(w) }))),
		expect: { ...designers, owner: 303, designer: 303, default: 403 }
	}
];
