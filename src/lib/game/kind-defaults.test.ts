import { describe, expect, it } from 'vitest';
import { cardSize, CardKindSchema, findReferenceProblems } from '$lib/game/model';
import { demoGame } from '$lib/demo/demo';
import { blankCard, newKind } from './kind-defaults';

describe('new card kinds', () => {
	it('makes a complete kind the model accepts', () => {
		const input = { name: 'Sprint cards', type: 'movement' as const, size: cardSize('poker'), bleed: 'us' as const, template: 'movement' };
		const kind = newKind(input, 'kd-new');
		expect(CardKindSchema.safeParse(kind).success).toBe(true);
		// Poker trim 2.5 × 3.5 in = 63.5 × 88.9 mm (1 in = 25.4 mm exactly; the size is common practice).
		expect(kind.size.widthMm).toBeCloseTo(2.5 * 25.4, 9);
		expect(kind.size.heightMm).toBeCloseTo(3.5 * 25.4, 9);
		expect(kind.back).toMatchObject({ mode: 'shared', template: 'back' });
	});

	it('gives track tiles a back per card and a blank tile the next number', () => {
		const game = demoGame();
		const tiles = newKind({ name: 'More tiles', type: 'tile', size: cardSize('tarot', true), bleed: 'metric', template: 'tile-front' }, 'kd-tile');
		expect(tiles.back.mode).toBe('per-card');
		const card = blankCard(tiles, game, 'kd-tile.new');
		expect(card.data).toMatchObject({ type: 'tile', number: 9 });
		// A blank card of a demo kind only lacks its name.
		const move = blankCard(game.kinds[0], game, 'kd-movement.new');
		expect(findReferenceProblems({ ...game, cards: [...game.cards, { ...move, name: 'New' }] })).toEqual([]);
	});
});
