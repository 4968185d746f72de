/** Wager prices worked by hand: Σ P(place) × coins for one card, and the top-row value meeting a target. */
import { describe, expect, it } from 'vitest';
import type { Game } from '../game/model';
import { expectedCoins, priceWagers, topRowToMeet } from './wagers';

const table = { id: 'mt-a', name: 'First pick', rows: [{ place: 1, coins: 5 }, { place: 2, coins: 1 }], otherCoins: -1 };

describe('expected coins', () => {
	it('is Σ P(place) × coins, worked by hand for one card', () => {
		// P = (0.4, 0.3, 0.2, 0.1): 0.4 × 5 + 0.3 × 1 + 0.2 × (−1) + 0.1 × (−1) = 2 + 0.3 − 0.2 − 0.1 = 2.0
		expect(expectedCoins(table, [0.4, 0.3, 0.2, 0.1])).toBeCloseTo(2.0, 12);
	});

	it('names the top-row value that brings the card down to the target', () => {
		// Target 0: rest = 0.3 × 1 + 0.3 × (−1) = 0, so 0.4 × v ≤ 0 → v = 0.
		expect(topRowToMeet(table, [0.4, 0.3, 0.2, 0.1], 0)).toEqual({ place: 1, coins: 0 });
		// Target 1: 0.4 × v ≤ 1 → v ≤ 2.5 → 2 whole coins.
		expect(topRowToMeet(table, [0.4, 0.3, 0.2, 0.1], 1)).toEqual({ place: 1, coins: 2 });
		// The top row's place never happens: no value helps.
		expect(topRowToMeet(table, [0, 0.5, 0.5, 0], 0)).toBeUndefined();
	});

	it('prices stage cards on stage odds and race cards on race odds, flagging the generous ones', () => {
		const game = {
			moneyTables: [table, { id: 'mt-w', name: 'Winner', rows: [{ place: 1, coins: 8 }], otherCoins: -1 }],
			cards: [
				{ id: 'w1', kindId: 'k', name: 'Amber stage', copies: 1, data: { type: 'wager', betType: 'stage', runnerId: 'amber', tier: 1, moneyTableId: 'mt-a' } },
				{ id: 'w2', kindId: 'k', name: 'Amber wins', copies: 1, data: { type: 'wager', betType: 'winner', runnerId: 'amber', tier: 1, moneyTableId: 'mt-w' } },
				{ id: 'w3', kindId: 'k', name: 'Teal stage', copies: 1, data: { type: 'wager', betType: 'stage', runnerId: 'teal', tier: 1, moneyTableId: 'mt-a' } }
			]
		} as unknown as Pick<Game, 'cards' | 'moneyTables'>;
		const priced = priceWagers(game, {
			stage: { amber: [0.4, 0.3, 0.2, 0.1], teal: [0.1, 0.1, 0.3, 0.5] },
			race: { amber: [0.1, 0.3, 0.3, 0.3] }
		});
		const by = Object.fromEntries(priced.map((p) => [p.cardId, p]));
		expect(by.w1.expectedCoins).toBeCloseTo(2.0, 12);
		expect(by.w1.generous).toBe(true);
		expect(by.w1.topRowSuggestion).toBe(0);
		// 0.1 × 8 + 0.9 × (−1) = −0.1: not generous
		expect(by.w2.expectedCoins).toBeCloseTo(-0.1, 12);
		expect(by.w2.generous).toBe(false);
		// 0.1 × 5 + 0.1 × 1 − 0.8 = −0.2
		expect(by.w3.expectedCoins).toBeCloseTo(-0.2, 12);
	});
});
