/** Rows of the role × route table: reads and saves beside the main areas' rows (mute, verdicts, print jobs, tables, runners). */
import type { Row } from '../role-table';
import { as, g, readers, designers, members } from '../role-table';
import { statusOf, superformJson, type World, actorIn } from '../harness';
import { cutProof, releaseProof, proofsOf } from '$lib/server/proofs';
import { newId } from '$lib/game/model';
import * as muteApi from '../../../src/routes/api/v1/games/[gameId=id]/mute/+server';
import * as verdictsApi from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/verdicts/+server';
import * as proofBack from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/cards/[cardId]/back.svg/+server';
import * as jobApi from '../../../src/routes/api/v1/print-jobs/[jobId=id]/+server';
import * as jobFileApi from '../../../src/routes/api/v1/print-jobs/[jobId=id]/file/+server';
import * as jobEventsApi from '../../../src/routes/api/v1/print-jobs/[jobId=id]/events/+server';
import * as tablesPage from '../../../src/routes/(app)/games/[gameId=id]/money-tables/+page.server';
import * as runnersPage from '../../../src/routes/(app)/games/[gameId=id]/runners/+page.server';

const all = { default: 200, anonymous: 401, outsider: 404 };
const designer = (w: World) => ({ id: w.callers.designer!.id, name: w.callers.designer!.name });
const fresh = (w: World) => cutProof(w.db, actorIn(w, 'designer'), { description: 'coverage rows' });
async function firstCard(w: World) {
	const [p] = await proofsOf(w.db, w.gameId, false);
	return (p.snapshot as { cards: { id: string }[] }).cards[0].id;
}
/** Nobody holds a job of this id: a signed-in caller learns only that it is not theirs. */
const unknownJob = '00000000-0000-4000-8000-000000000000';

export const rows: Row[] = [
	{ route: 'GET /api/v1/games/{gameId}/mute', run: (w, who) => statusOf(() => muteApi.GET(as(w, who, { params: g(w) }))), expect: all },
	{
		route: 'GET /api/v1/games/{gameId}/proofs/{proofId}/verdicts (unreleased)',
		run: async (w, who) => {
			const p = await fresh(w);
			return statusOf(() => verdictsApi.GET(as(w, who, { params: g(w, { proofId: p.id }) })));
		},
		expect: { ...readers, printer: 404, default: 200 }
	},
	{
		route: 'GET /api/v1/games/{gameId}/proofs/{proofId}/cards/{cardId}/back.svg (released)',
		run: async (w, who) => {
			const p = await releaseProof(w.db, actorIn(w, 'designer'), { proof: await fresh(w) });
			const cardId = await firstCard(w);
			return statusOf(() => proofBack.GET(as(w, who, { params: g(w, { proofId: p.id, cardId }) })));
		},
		expect: all
	},
	{
		route: 'GET /api/v1/print-jobs/{jobId} (no job of the caller)',
		run: (w, who) => statusOf(() => jobApi.GET(as(w, who, { params: { jobId: unknownJob } }))),
		expect: { default: 404, anonymous: 401 }
	},
	{
		route: 'GET /api/v1/print-jobs/{jobId}/events (no job of the caller)',
		run: (w, who) => statusOf(() => jobEventsApi.GET(as(w, who, { params: { jobId: unknownJob } }))),
		expect: { default: 404, anonymous: 401 }
	},
	{
		route: 'GET /api/v1/print-jobs/{jobId}/file (no job of the caller)',
		run: (w, who) => statusOf(() => jobFileApi.GET(as(w, who, { params: { jobId: unknownJob } }))),
		expect: { default: 404, anonymous: 401 }
	},
	{
		route: 'action /games/{gameId}/money-tables?/save (a new table)',
		run: (w, who) =>
			statusOf(() =>
				tablesPage.actions.save(
					as(w, who, { params: g(w), form: superformJson({ id: newId(), name: `Table by ${who}`, rows: [{ place: 1, coins: 5 }], otherCoins: -1 }) })
				)
			),
		expect: { ...designers, default: 403 }
	},
	{
		route: 'action /games/{gameId}/runners?/delete (unknown runner)',
		run: (w, who) => statusOf(() => runnersPage.actions.delete(as(w, who, { params: g(w), form: { id: 'no-such-runner', version: '1' } }))),
		expect: { ...designers, owner: 404, designer: 404, default: 403, ...members }
	}
];
