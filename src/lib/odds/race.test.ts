/** Whole races of the demo game: the deal, the track, sums, the length distribution, and seeds. */
import { describe, expect, it } from 'vitest';
import { demoGame } from '../demo/demo';
import { raceSetupFromGame, RaceSetupError, simulateRaces } from './race';

describe('whole races from the game data', () => {
	const game = demoGame();

	it('builds the track and the deal from the setup card', () => {
		const setupCard = game.cards.find((c) => c.data.type === 'setup' && c.data.players === 4)!;
		const deal = setupCard.data.type === 'setup' ? setupCard.data : undefined;
		const setup = raceSetupFromGame(game, 4);
		const tiles = game.cards.flatMap((c) => (c.data.type === 'tile' ? [c.data] : []));
		// start tile + (length − 2) normal tiles + finish tile, front sides: finish is one past the last space.
		const normal = tiles.filter((t) => t.role === 'normal').sort((a, b) => a.number - b.number).slice(0, deal!.trackLength - 2);
		const spaces = tiles.find((t) => t.role === 'start')!.spacesFront + normal.reduce((n, t) => n + t.spacesFront, 0) + tiles.find((t) => t.role === 'finish')!.spacesFront;
		expect(setup.finish).toBe(spaces + 1);
		expect(setup.sharedCards).toBe(deal!.toSharedDeck + deal!.extraFromDeck);
		expect(setup.faceUpCards).toBe(deal!.faceUp);
		expect(setup.runners.slice(0, -1)).toEqual(game.runners.map((r) => r.id));
	});

	it('refuses a player count without a setup card', () => {
		expect(() => raceSetupFromGame(game, 11)).toThrow(RaceSetupError);
	});

	it('gives distributions that sum to 1, and the same answer for the same seed', () => {
		const setup = raceSetupFromGame(game, 4);
		const a = simulateRaces(setup, 3000, 9);
		for (const rows of [a.final, a.stage]) {
			for (const row of rows) expect(row.reduce((x, y) => x + y, 0)).toBeCloseTo(1, 9);
			for (let p = 0; p < rows.length; p++) expect(rows.reduce((x, row) => x + row[p], 0)).toBeCloseTo(1, 9);
		}
		expect(a.stageCounts.reduce((x, s) => x + s.probability, 0) + a.unfinished).toBeCloseTo(1, 12);
		expect(simulateRaces(setup, 3000, 9)).toEqual(a);
	});

	it('keeps rogue cards apart when the setup adds them to the shared deck', () => {
		const g = demoGame();
		for (const c of g.cards) if (c.data.type === 'setup') c.data.rogueToDeck = 2;
		const setup = raceSetupFromGame(g, 4);
		const rogueCards = g.cards.filter((c) => c.data.type === 'rogue').reduce((n, c) => n + c.copies, 0);
		expect(setup.rogueSteps).toHaveLength(rogueCards);
		expect(setup.deckRunner.includes(setup.runners.length - 1)).toBe(false);
		const odds = simulateRaces(setup, 500, 1);
		expect(odds.races).toBe(500);
	});
});
