/** Rows of the role × route table: the game's pages, their form actions and its face routes. */
import type { Row } from '../role-table';
import { as, g, game, readers, designers } from '../role-table';
import { statusOf, superformJson } from '../harness';
import * as teamPage from '../../../src/routes/(app)/teams/[teamId=id]/+page.server';
import { exportBundle } from '$lib/server/game-io';
import * as overview from '../../../src/routes/(app)/games/[gameId=id]/+page.server';
import * as runnersPage from '../../../src/routes/(app)/games/[gameId=id]/runners/+page.server';
import * as tablesPage from '../../../src/routes/(app)/games/[gameId=id]/money-tables/+page.server';
import * as faceSvg from '../../../src/routes/api/v1/games/[gameId=id]/cards/[cardId]/face.svg/+server';
import * as backSvg from '../../../src/routes/api/v1/games/[gameId=id]/cards/[cardId]/back.svg/+server';
import * as preview from '../../../src/routes/api/v1/games/[gameId=id]/preview/+server';
import * as artFile from '../../../src/routes/api/v1/games/[gameId=id]/art-files/[sha256]/+server';

/** Everyone in the team reaches the overview (printers get a note about releases). */
const team = { default: 200, anonymous: 401, outsider: 404 };
/** A refused form save answers 409 with the newer data, here because the form sends an old version. */
const saves = { ...designers };

export const rows: Row[] = [
	{
		route: 'action /teams/{teamId}?/importGame',
		run: async (w, who) => {
			const zip = (await exportBundle(w.db, w.gameId)).zip;
			const bundle = new File([Buffer.from(zip)], 'game.zip', { type: 'application/zip' });
			return statusOf(() => teamPage.actions.importGame(as(w, who, { params: { teamId: w.teamId }, form: { bundle } })));
		},
		expect: { ...designers, owner: 303, designer: 303, default: 403 }
	},
	{ route: 'load /games/{gameId} (overview)', run: (w, who) => statusOf(() => overview.load(as(w, who, { params: g(w) }))), expect: team },
	{ route: 'load /games/{gameId}/runners', run: (w, who) => statusOf(() => runnersPage.load(as(w, who, { params: g(w) }))), expect: { ...readers, default: 200 } },
	{
		route: 'action /games/{gameId}/runners?/save',
		run: async (w, who) => {
			const r = (await game(w)).runners[1];
			return statusOf(() =>
				runnersPage.actions.save(as(w, who, { params: g(w), form: superformJson({ ...r, name: `${r.name.slice(0, 20)} ${who}` }) }))
			);
		},
		expect: { ...saves, default: 403 }
	},
	{
		route: 'action /games/{gameId}/runners?/saveRogue',
		run: async (w, who) => {
			const rogue = (await game(w)).rogueRunner!;
			return statusOf(() => runnersPage.actions.saveRogue(as(w, who, { params: g(w), path: '/?/saveRogue', form: { ...superformJson(rogue), __superform_id: 'rogue' } })));
		},
		expect: { ...saves, default: 403 }
	},
	{ route: 'load /games/{gameId}/money-tables', run: (w, who) => statusOf(() => tablesPage.load(as(w, who, { params: g(w) }))), expect: { ...readers, default: 200 } },
	{
		route: 'action /games/{gameId}/money-tables?/delete (unknown table)',
		run: (w, who) => statusOf(() => tablesPage.actions.delete(as(w, who, { params: g(w), form: { id: 'no-such-table', version: '1' } }))),
		expect: { ...designers, owner: 404, designer: 404, default: 403 }
	},
	{
		route: 'GET /api/v1/games/{gameId}/cards/{cardId}/face.svg',
		run: async (w, who) => {
			const card = (await game(w)).cards[0];
			return statusOf(() => faceSvg.GET(as(w, who, { params: g(w, { cardId: card.id }) })));
		},
		expect: { ...readers, default: 200 }
	},
	{
		route: 'GET /api/v1/games/{gameId}/cards/{cardId}/back.svg',
		run: async (w, who) => {
			const card = (await game(w)).cards[0];
			return statusOf(() => backSvg.GET(as(w, who, { params: g(w, { cardId: card.id }) })));
		},
		expect: { ...readers, default: 200 }
	},
	{
		route: 'POST /api/v1/games/{gameId}/preview',
		run: async (w, who) => {
			const gm = await game(w);
			const card = gm.cards[0];
			const kind = gm.kinds.find((k) => k.id === card.kindId)!;
			return statusOf(() => preview.POST(as(w, who, { params: g(w), json: { kind, card, side: 'front' } })));
		},
		expect: { ...readers, default: 200 }
	},
	{
		route: 'GET /api/v1/games/{gameId}/art-files/{sha256}',
		run: async (w, who) => {
			const art = (await game(w)).art[0];
			return statusOf(() => artFile.GET(as(w, who, { params: g(w, { sha256: art.sha256 }) })));
		},
		expect: { ...readers, default: 200 }
	}
];
