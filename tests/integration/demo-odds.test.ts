/**
 * The demo game ships the start-of-stage scenarios its money tables were priced on: the saved
 * scenarios list shows them to anyone who may read the odds, and each runs as saved.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openWorld, type World } from './harness';
import { as, g } from './role-table';
import { DEMO_STAGE_POSITIONS } from '$lib/demo/demo';
import { demoScenarios } from '$lib/demo/pricing';
import { ScenarioSchema } from '$lib/odds/scenario';
import * as oddsApi from '../../src/routes/api/v1/games/[gameId=id]/odds/+server';
import * as scenariosApi from '../../src/routes/api/v1/games/[gameId=id]/odds/scenarios/+server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

describe('the demo game’s saved odds scenarios', () => {
	it('GET /api/v1/games/{gameId}/odds/scenarios lists every pricing position with its deal', async () => {
		const res = await scenariosApi.GET(as(w, 'reviewer', { params: g(w) }));
		expect(res.status).toBe(200);
		const { scenarios } = (await res.json()) as { scenarios: { name: string; scenario: unknown; lastResult: unknown }[] };
		const byName = new Map(scenarios.map((s) => [s.name, s]));
		for (const { name, scenario } of demoScenarios()) {
			expect(byName.has(name), name).toBe(true);
			expect(byName.get(name)!.scenario).toEqual(ScenarioSchema.parse(scenario));
		}
		expect(DEMO_STAGE_POSITIONS.every((p) => byName.has(p.name))).toBe(true);
	});

	it('runs a saved scenario exactly, pricing the stage wager cards of the snails on the track', async () => {
		const res = await scenariosApi.GET(as(w, 'designer', { params: g(w) }));
		const { scenarios } = (await res.json()) as { scenarios: { name: string; scenario: Record<string, unknown> }[] };
		const stretch = scenarios.find((s) => s.name === DEMO_STAGE_POSITIONS.at(-1)!.name)!;
		const run = await oddsApi.POST(as(w, 'designer', { params: g(w), json: { ...stretch.scenario, exact: true } }));
		expect(run.status).toBe(200);
		const body = (await run.json()) as { method: string; stage: Record<string, number[]>; wagers: { cardId: string; expectedCoins: number }[] };
		expect(body.method).toBe('exact');
		expect(Object.keys(body.stage)).toHaveLength(6);
		// Two stage tiers per snail.
		expect(body.wagers.filter((x) => x.cardId.includes('.wg.stage.'))).toHaveLength(12);
	}, 60_000);
});
