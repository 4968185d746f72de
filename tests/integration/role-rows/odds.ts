/** Rows of the role × route table: the odds lab's API (runs, saved scenarios, jobs) and the Odds tab. */
import type { Row } from '../role-table';
import { as, g, readers, signedIn, editors } from '../role-table';
import { statusOf, type World, actorIn } from '../harness';
import * as oddsPage from '../../../src/routes/(app)/games/[gameId=id]/odds/+page.server';
import { runOdds } from '$lib/server/odds';
import * as oddsApi from '../../../src/routes/api/v1/games/[gameId=id]/odds/+server';
import * as scenariosApi from '../../../src/routes/api/v1/games/[gameId=id]/odds/scenarios/+server';
import * as jobApi from '../../../src/routes/api/v1/odds-jobs/[jobId=id]/+server';

/** A stage of the demo game's own runners: two snails stacked, the beetle ahead, four cards. */
export const demoStage = {
	finish: 14,
	stacks: [
		{ space: 2, bottomToTop: ['rn-rosehip', 'rn-saffron'] },
		{ space: 4, bottomToTop: ['rn-sorrel'] },
		{ space: 9, bottomToTop: ['rn-burrowback'] }
	],
	rogue: { runner: 'rn-burrowback' },
	modifiers: [{ space: 6, steps: 1 }],
	deck: [
		{ runner: 'rn-rosehip', steps: 2 },
		{ runner: 'rn-saffron', steps: 1 },
		{ runner: 'rn-sorrel', steps: 3 },
		{ runner: 'rn-burrowback', steps: 2 }
	]
};

/** A job started by the designer, for the job route rows. */
let jobId: string | undefined;
async function designersJob(w: World) {
	if (jobId) return jobId;
	const out = await runOdds(w.db, actorIn(w, 'designer'), { ...demoStage, samples: 200_001, seed: 4 });
	if (!('job' in out)) throw new Error('expected a job');
	jobId = out.job.id;
	return jobId;
}
/** Only the person who started a job sees it; for everyone else it does not exist. */
const jobOwner = { default: 404, designer: 200, ...signedIn };

export const rows: Row[] = [
	{
		route: 'load /games/{gameId}/odds',
		run: (w, who) => statusOf(() => oddsPage.load(as(w, who, { params: g(w) }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'action /games/{gameId}/odds?/rules',
		run: (w, who) =>
			statusOf(() =>
				oddsPage.actions.rules(as(w, who, { params: g(w), form: { rogueCarryBonus: '1', modifiersOneUse: 'on', backUnder: 'on' } }))
			),
		// A saved form answers 200 with its message (superforms), not a redirect.
		expect: { ...editors, owner: 200, designer: 200, default: 403 }
	},
	{
		route: 'POST /api/v1/games/{gameId}/odds (exact)',
		run: (w, who) => statusOf(() => oddsApi.POST(as(w, who, { params: g(w), json: { ...demoStage, exact: true } }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'POST /api/v1/games/{gameId}/odds (samples)',
		run: (w, who) => statusOf(() => oddsApi.POST(as(w, who, { params: g(w), json: { ...demoStage, samples: 2000, seed: 1 } }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'GET /api/v1/games/{gameId}/odds/scenarios',
		run: (w, who) => statusOf(() => scenariosApi.GET(as(w, who, { params: g(w) }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'POST /api/v1/games/{gameId}/odds/scenarios',
		run: (w, who) =>
			statusOf(() => scenariosApi.POST(as(w, who, { params: g(w), json: { name: `rows ${who}`, scenario: demoStage } }))),
		expect: { ...readers, owner: 201, designer: 201, artist: 201, reviewer: 201, default: 201 }
	},
	{
		route: 'GET /api/v1/odds-jobs/{jobId}',
		run: async (w, who) => statusOf(async () => jobApi.GET(as(w, who, { params: { jobId: await designersJob(w) } }))),
		expect: jobOwner
	},
	{
		route: 'DELETE /api/v1/odds-jobs/{jobId}',
		run: async (w, who) => statusOf(async () => jobApi.DELETE(as(w, who, { method: 'DELETE', params: { jobId: await designersJob(w) } }))),
		expect: jobOwner
	}
];
