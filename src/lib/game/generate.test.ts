import { describe, expect, it } from 'vitest';
import {
	generateMovementCards,
	generateRogueCards,
	generateTiles,
	generateWagerCards,
	movementCardId,
	replaceKindCards
} from './generate';
import { CardSchema, type CardKind, type MoneyTable, type Runner } from './model';
import { DEMO_KINDS, DEMO_ROGUE } from '$lib/demo/demo';

const kindOf = (type: CardKind['type']) => DEMO_KINDS.find((k) => k.type === type)!;
const runner = (id: string, name: string, sortOrder: number): Runner => ({
	id,
	name,
	colourHex: '#000000',
	cmyk: { c: 0, m: 0, y: 0, k: 100 },
	symbol: 'dot',
	sortOrder
});
// Given out of order on purpose: cards follow sortOrder.
const runners = [runner('b', 'Bee', 2), runner('a', 'Ant', 1), runner('c', 'Cricket', 3)];
const tables: MoneyTable[] = ['t1', 't2'].map((id) => ({ id, name: id, rows: [{ place: 1, coins: 2 }], otherCoins: -1 }));

describe('generateMovementCards', () => {
	it('makes runners × steps cards with the copies on each', () => {
		const cards = generateMovementCards({ kind: kindOf('movement'), runners, steps: [3, 1, 2], copies: 2 });
		expect(cards).toHaveLength(9);
		expect(cards.reduce((n, c) => n + c.copies, 0)).toBe(18);
		expect(cards.slice(0, 3).map((c) => c.name)).toEqual(['Ant 1', 'Ant 2', 'Ant 3']);
		expect(cards[0].data).toEqual({ type: 'movement', runnerId: 'a', steps: 1 });
		for (const c of cards) expect(CardSchema.safeParse(c).success).toBe(true);
	});
	it('gives the same ids every time, and unique ones', () => {
		const args = { kind: kindOf('movement'), runners, steps: [1, 2], copies: 1 };
		const a = generateMovementCards(args).map((c) => c.id);
		expect(generateMovementCards(args).map((c) => c.id)).toEqual(a);
		expect(new Set(a).size).toBe(a.length);
		expect(a[0]).toBe(movementCardId(kindOf('movement').id, 'a', 1));
	});
	it('refuses bad step values, bad copies and the wrong kind', () => {
		const kind = kindOf('movement');
		expect(() => generateMovementCards({ kind, runners, steps: [0], copies: 1 })).toThrow(/1..9/);
		expect(() => generateMovementCards({ kind, runners, steps: [1, 1], copies: 1 })).toThrow(/twice/);
		expect(() => generateMovementCards({ kind, runners, steps: [], copies: 1 })).toThrow();
		expect(() => generateMovementCards({ kind, runners, steps: [1], copies: -1 })).toThrow();
		expect(() => generateMovementCards({ kind: kindOf('wager'), runners, steps: [1], copies: 1 })).toThrow(/not movement/);
	});
});

describe('generateRogueCards', () => {
	it('makes one card per step value', () => {
		const cards = generateRogueCards({ kind: kindOf('rogue'), rogue: DEMO_ROGUE, steps: [2, 1], copies: 3 });
		expect(cards.map((c) => c.data)).toEqual([
			{ type: 'rogue', steps: 1 },
			{ type: 'rogue', steps: 2 }
		]);
		expect(cards.every((c) => c.copies === 3)).toBe(true);
	});
});

describe('generateWagerCards', () => {
	it('makes bet types × runners × tiers, tier n printing the n-th table', () => {
		const cards = generateWagerCards({
			kind: kindOf('wager'),
			runners,
			tiers: { stage: ['t1', 't2'], loser: ['t2'] },
			moneyTables: tables,
			copies: 1
		});
		expect(cards).toHaveLength(3 * 2 + 3 * 1);
		const stageAnt = cards.filter((c) => c.data.type === 'wager' && c.data.betType === 'stage' && c.data.runnerId === 'a');
		expect(stageAnt.map((c) => c.data)).toEqual([
			{ type: 'wager', betType: 'stage', runnerId: 'a', tier: 1, moneyTableId: 't1' },
			{ type: 'wager', betType: 'stage', runnerId: 'a', tier: 2, moneyTableId: 't2' }
		]);
		expect(cards.some((c) => c.data.type === 'wager' && c.data.betType === 'winner')).toBe(false);
		expect(new Set(cards.map((c) => c.id)).size).toBe(cards.length);
		expect(new Set(cards.map((c) => c.name)).size).toBe(cards.length);
	});
	it('refuses a money table that does not exist', () => {
		expect(() =>
			generateWagerCards({ kind: kindOf('wager'), runners, tiers: { winner: ['nope'] }, moneyTables: tables, copies: 1 })
		).toThrow(/nope/);
	});
});

describe('generateTiles', () => {
	it('numbers tiles from the start to the finish, with their own reverse sides', () => {
		const tiles = generateTiles({
			kind: kindOf('tile'),
			count: 4,
			spacesFront: 3,
			spacesBack: 2,
			backLabel: 'Narrow',
			endSpaces: 1,
			startLabel: 'Gate'
		});
		expect(tiles.map((t) => t.data)).toEqual([
			{ type: 'tile', number: 1, role: 'start', spacesFront: 1, spacesBack: 1, backLabel: 'Gate' },
			{ type: 'tile', number: 2, role: 'normal', spacesFront: 3, spacesBack: 2, backLabel: 'Narrow' },
			{ type: 'tile', number: 3, role: 'normal', spacesFront: 3, spacesBack: 2, backLabel: 'Narrow' },
			{ type: 'tile', number: 4, role: 'finish', spacesFront: 1, spacesBack: 1, backLabel: 'Narrow' }
		]);
		expect(() => generateTiles({ kind: kindOf('tile'), count: 1, spacesFront: 3, spacesBack: 2, backLabel: '' })).toThrow();
	});
});

describe('replaceKindCards', () => {
	it('swaps one kind’s cards in place, keeping versions of surviving ids', () => {
		const kind = kindOf('movement');
		const other = { id: 'x', kindId: 'other', name: 'X', copies: 1, data: { type: 'rogue', steps: 1 } } as const;
		const before = generateMovementCards({ kind, runners, steps: [1, 2], copies: 1 }).map((c) => ({ ...c, version: 4 }));
		const after = generateMovementCards({ kind, runners, steps: [2, 3], copies: 2 });
		const merged = replaceKindCards([other, ...before, other], kind.id, after);
		expect(merged[0]).toBe(other);
		expect(merged[merged.length - 1]).toBe(other);
		const mine = merged.filter((c) => c.kindId === kind.id);
		expect(mine).toHaveLength(6);
		expect(mine.find((c) => c.name === 'Ant 2')!.version).toBe(4);
		expect(mine.find((c) => c.name === 'Ant 3')!.version).toBeUndefined();
		expect(mine.every((c) => c.copies === 2)).toBe(true);
	});
});
