/**
 * The demo's money tables stay inside the targets they were priced to (./demo, DEMO_TABLE_TARGETS):
 * a later change to the cards, the track, the deal or a table that breaks the pricing fails here.
 */
import { describe, expect, it } from 'vitest';
import { coinsForPlace } from '../game/model';
import { ScenarioSchema } from '../odds/scenario';
import { compileStage, exactStage } from '../odds/stage';
import { expectedCoins } from '../odds/wagers';
import { DEMO_MONEY_TABLES, DEMO_STAGE_POSITIONS, DEMO_TABLE_TARGETS, demoGame } from './demo';
import { demoScenarios, leaderOf, priceDemo } from './pricing';

const game = demoGame();

describe('demo money tables against their targets (odds lab)', () => {
	// Fewer deals and races than the pricing run (npm run odds:demo), seeded: the same answer every time.
	const pricing = priceDemo(game, { deals: 160, samples: 400, races: 20_000, seed: 3 });

	it('prices every money table of the demo', () => {
		expect(pricing.tables.map((t) => t.table.id).sort()).toEqual(DEMO_MONEY_TABLES.map((t) => t.id).sort());
		expect(Object.keys(DEMO_TABLE_TARGETS).sort()).toEqual(DEMO_MONEY_TABLES.map((t) => t.id).sort());
	});

	it.each(pricing.tables.map((t) => [t.table.name, t] as const))('%s: every card’s expected coins sit in the band', (_name, t) => {
		for (const card of t.cards) {
			expect(card.standardError, `${card.runner}: standard error`).toBeLessThan(0.1);
			expect(card.expectedCoins, card.runner).toBeGreaterThanOrEqual(t.band[0]);
			expect(card.expectedCoins, card.runner).toBeLessThanOrEqual(t.band[1]);
		}
	});

	it('pays each later pick less than the one before', () => {
		for (const bet of ['stage', 'winner', 'loser'] as const) {
			const tiers = pricing.tables.filter((t) => t.betType === bet).sort((a, b) => a.tier - b.tier);
			const mean = (t: (typeof tiers)[number]) => t.cards.reduce((s, c) => s + c.expectedCoins, 0) / t.cards.length;
			for (let i = 1; i < tiers.length; i++) expect(mean(tiers[i]), `${bet} tier ${i + 1}`).toBeLessThan(mean(tiers[i - 1]));
		}
	});

	it('makes a stage pick at random lose coins: every stage table averages below 0 over the places', () => {
		for (const t of pricing.tables.filter((x) => x.betType === 'stage')) expect(t.blindCoins, t.table.name).toBeLessThan(0);
	});

	it('keeps the race within 3½ to 6 stages on the 4-player track', () => {
		expect(pricing.race.meanStages).toBeGreaterThan(3.5);
		expect(pricing.race.meanStages).toBeLessThan(6);
		expect(pricing.race.unfinished).toBe(0);
	});
});

describe('the saved start-of-stage scenarios', () => {
	const saved = demoScenarios(game);

	it('are one per position, each a valid scenario whose deck the lab can enumerate exactly', () => {
		expect(saved.map((s) => s.name)).toEqual(DEMO_STAGE_POSITIONS.map((p) => p.name));
		for (const s of saved) {
			const parsed = ScenarioSchema.parse(s.scenario);
			// 4 players: 8 dealt + 1 added + 2 face up + 1 beetle card (the setup card's deal).
			expect(parsed.deck, s.name).toHaveLength(12);
			expect(parsed.finish).toBe(23);
		}
	});

	it('opening stage, exact: a pick at random expects the table’s average, below 0', () => {
		// Σ over runners of P(place) is 1 for every place, so the six cards' mean is the table's mean.
		const odds = exactStage(compileStage(ScenarioSchema.parse(saved[0].scenario)));
		expect(leaderOf(DEMO_STAGE_POSITIONS[0], game.rogueRunner?.id)).toBeUndefined();
		for (const table of DEMO_MONEY_TABLES.filter((t) => DEMO_TABLE_TARGETS[t.id].betType === 'stage')) {
			const coins = odds.places.map((p) => expectedCoins(table, p));
			const average = [1, 2, 3, 4, 5, 6].reduce((s, place) => s + coinsForPlace(table, place)!, 0) / 6;
			expect(coins.reduce((a, b) => a + b, 0) / coins.length).toBeCloseTo(average, 9);
			expect(average).toBeLessThan(0);
		}
	}, 60_000);
});
