import { describe, expect, it } from 'vitest';
import { cardCount, checkDeal, checkDeck, deckSupply, kindTotals, type DeckSupply } from './deck-check';
import { demoGame } from '$lib/demo/demo';
import type { SetupData } from './model';

const supply = (deckCards: number, tiles = 8): DeckSupply => ({
	movementCards: deckCards,
	rogueCards: 0,
	deckCards,
	tiles,
	startTiles: 1,
	finishTiles: 1
});
const setup = (patch: Partial<SetupData>): SetupData => ({
	type: 'setup',
	players: 4,
	handSize: 4,
	discards: 6,
	toSharedDeck: 8,
	faceUp: 2,
	extraFromDeck: 1,
	trackLength: 6,
	...patch
});

describe('checkDeal (worked by hand)', () => {
	it('4 players × 4 + 6 + 8 + 2 + 1 = 33 of 42 leaves 9, shared deck 8 + 1 = 9', () => {
		const d = checkDeal(setup({}), supply(42));
		expect(d).toMatchObject({ handCards: 16, neededCards: 33, remainder: 9, sharedDeckCards: 9, ok: true });
		expect(d.issues).toEqual([{ severity: 'info', message: '4 players: 9 cards stay out of the stage', players: 4 }]);
	});
	it('a deal that uses the deck exactly leaves nothing and passes', () => {
		const d = checkDeal(setup({}), supply(33));
		expect(d.remainder).toBe(0);
		expect(d.ok).toBe(true);
		expect(d.issues).toEqual([]);
	});
	it('6 players × 6 + 6 + 8 + 2 + 1 = 53 of 42 is 11 short', () => {
		const d = checkDeal(setup({ players: 6, handSize: 6 }), supply(42));
		expect(d.remainder).toBe(-11);
		expect(d.ok).toBe(false);
		expect(d.issues[0].message).toBe(
			'6 players: the deal needs 53 movement cards (6 × 6 in hand, 6 discarded, 8 to the shared deck, ' +
				'2 face up, 1 extra from the deck) but the deck has 42: 11 short'
		);
	});
	it('an empty shared deck is impossible', () => {
		const d = checkDeal(setup({ toSharedDeck: 0, extraFromDeck: 0 }), supply(42));
		expect(d.ok).toBe(false);
		expect(d.issues.map((i) => i.message)).toContain(
			'4 players: the shared deck would be empty, so a stage would end before it starts'
		);
	});
	it('a track longer than the tiles is impossible', () => {
		const d = checkDeal(setup({ trackLength: 9 }), supply(42, 8));
		expect(d.ok).toBe(false);
		expect(d.issues.map((i) => i.message)).toContain('4 players: the track is 9 tiles long but the game has only 8 tiles');
	});
	it('no hand is allowed but worth a warning', () => {
		const d = checkDeal(setup({ handSize: 0 }), supply(42));
		expect(d.ok).toBe(true);
		expect(d.issues.some((i) => i.severity === 'warning')).toBe(true);
	});
});

describe('checkDeck on the demo game', () => {
	const game = demoGame();
	it('counts 6 runners × (3 + 3 + 1) copies = 42 snail cards and 2 + 1 beetle cards', () => {
		expect(deckSupply(game)).toEqual({ movementCards: 42, rogueCards: 3, deckCards: 45, tiles: 8, startTiles: 1, finishTiles: 1 });
	});
	it('passes for every player count 2..8', () => {
		const check = checkDeck(game);
		expect(check.deals.map((d) => d.players)).toEqual([2, 3, 4, 5, 6, 7, 8]);
		expect(check.issues.filter((i) => i.severity !== 'info')).toEqual([]);
		expect(check.ok).toBe(true);
		// 2 players: 2 × 7 + 5 + 8 + 2 + 1 = 30 of the 42 snail cards (the beetle's are kept apart),
		// remainder 12; shared deck 8 + 1 snail cards + 1 beetle card.
		expect(check.deals[0]).toMatchObject({ handCards: 14, neededCards: 30, deckCards: 42, remainder: 12, sharedDeckCards: 10 });
	});
	it('totals per kind and for the game, with copies', () => {
		const totals = Object.fromEntries(kindTotals(game).map((k) => [k.kindId, [k.designs, k.cards]]));
		expect(totals).toEqual({
			'kd-movement': [18, 42],
			'kd-rogue': [2, 3],
			'kd-wager': [60, 60], // 6 runners × (2 stage + 4 winner + 4 last-place tiers)
			'kd-setup': [7, 7],
			'kd-hazard': [4, 8],
			'kd-aid': [2, 16],
			'kd-tile': [8, 8]
		});
		expect(checkDeck(game).totalCards).toBe(42 + 3 + 60 + 7 + 8 + 16 + 8);
		expect(cardCount(game.cards)).toBe(144);
	});
	it('flags a second setup card for one player count, a gap, and lopsided runners', () => {
		const g = demoGame();
		g.cards = g.cards.filter((c) => !(c.data.type === 'setup' && c.data.players === 5));
		const four = g.cards.find((c) => c.data.type === 'setup' && c.data.players === 4)!;
		g.cards.push({ ...four, id: 'dup', name: 'Another 4' });
		const firstMove = g.cards.find((c) => c.data.type === 'movement')!;
		firstMove.copies = 5; // Rosehip 1: 5 + 3 + 1 = 9 cards
		const messages = checkDeck(g).issues.map((i) => i.message);
		expect(messages).toContain('4 players have 2 setup cards (Setup for 4 players, Another 4); keep one');
		expect(messages).toContain('No setup card for 5 players');
		expect(messages.some((m) => m.startsWith('Runners have different numbers of movement cards: Rosehip 9, Saffron 7'))).toBe(true);
		expect(checkDeck(g).ok).toBe(false);
	});
	it('flags a track without start or finish tile', () => {
		const g = demoGame();
		g.cards = g.cards.filter((c) => !(c.data.type === 'tile' && c.data.role === 'finish'));
		expect(checkDeck(g).issues.map((i) => i.message)).toContain('The track has no finish tile');
	});
});
