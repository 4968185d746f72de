import { describe, expect, it } from 'vitest';
import {
	bleedMm,
	CARD_SIZES,
	CardKindSchema,
	CardSchema,
	CardSizeSchema,
	cardSize,
	cmykFractions,
	coinsForPlace,
	findReferenceProblems,
	GameSchema,
	MM_PER_INCH,
	RunnerSchema,
	safeMm,
	validateMoneyTable,
	type MoneyTable
} from './model';
import { demoGame } from '$lib/demo/demo';

describe('card sizes', () => {
	// Common practice among card printers, no formal standard. The inch is 25.4 mm exactly
	// (international yard and pound agreement, 1959), so the inch-based sizes must be exact.
	it('poker is 2.5 × 3.5 in', () => {
		expect(CARD_SIZES.poker.widthMm).toBeCloseTo(2.5 * MM_PER_INCH, 9);
		expect(CARD_SIZES.poker.heightMm).toBeCloseTo(3.5 * MM_PER_INCH, 9);
	});
	it('bridge is 2.25 × 3.5 in', () => {
		expect(CARD_SIZES.bridge.widthMm).toBeCloseTo(2.25 * MM_PER_INCH, 9);
		expect(CARD_SIZES.bridge.heightMm).toBeCloseTo(3.5 * MM_PER_INCH, 9);
	});
	it('mini, tarot and square are the metric sizes common in the trade', () => {
		expect(CARD_SIZES.mini).toEqual({ widthMm: 44, heightMm: 68 });
		expect(CARD_SIZES.tarot).toEqual({ widthMm: 70, heightMm: 120 });
		expect(CARD_SIZES.square).toEqual({ widthMm: 70, heightMm: 70 });
	});
	it('a preset must carry its own dimensions, either way round', () => {
		expect(CardSizeSchema.safeParse(cardSize('poker')).success).toBe(true);
		expect(CardSizeSchema.safeParse(cardSize('tarot', true)).success).toBe(true);
		expect(CardSizeSchema.safeParse({ preset: 'poker', widthMm: 60, heightMm: 88.9 }).success).toBe(false);
		expect(CardSizeSchema.safeParse({ preset: 'custom', widthMm: 60, heightMm: 90 }).success).toBe(true);
		expect(CardSizeSchema.safeParse({ preset: 'custom', widthMm: 0, heightMm: 90 }).success).toBe(false);
	});
});

describe('bleed and safe area', () => {
	it('US bleed and safe area are 1/8 in = 3.175 mm', () => {
		expect(bleedMm('us')).toBeCloseTo(3.175, 9);
		expect(safeMm('us')).toBeCloseTo(3.175, 9);
	});
	it('metric bleed is 3 mm and the text safe area 5 mm (common practice)', () => {
		expect(bleedMm('metric')).toBe(3);
		expect(safeMm('metric')).toBe(5);
	});
});

describe('runner schema', () => {
	const good = { id: 'r1', name: 'Test', colourHex: '#12abEF', cmyk: { c: 0, m: 10, y: 100, k: 0 }, symbol: 'dot', sortOrder: 0 };
	it('accepts a well-formed runner', () => expect(RunnerSchema.safeParse(good).success).toBe(true));
	it.each([
		['empty name', { name: '' }],
		['41-character name', { name: 'x'.repeat(41) }],
		['short hex', { colourHex: '#abc' }],
		['cmyk over 100 %', { cmyk: { c: 0, m: 0, y: 101, k: 0 } }],
		['unknown symbol', { symbol: 'heart' }],
		['fractional version', { version: 1.5 }]
	])('refuses %s', (_label, patch) => expect(RunnerSchema.safeParse({ ...good, ...patch }).success).toBe(false));
	it('turns CMYK percent into 0..1 fractions', () =>
		expect(cmykFractions({ c: 50, m: 0, y: 100, k: 25 })).toEqual([0.5, 0, 1, 0.25]));
});

describe('validateMoneyTable', () => {
	const t = (rows: [number, number][], otherCoins?: number): MoneyTable => ({
		id: 't',
		name: 'T',
		rows: rows.map(([place, coins]) => ({ place, coins })),
		...(otherCoins === undefined ? {} : { otherCoins })
	});
	it('accepts rows plus a catch-all for the other places', () => {
		expect(validateMoneyTable(t([[1, 5], [2, 1]], -1), 5)).toEqual({ ok: true, problems: [] });
	});
	it('accepts every place listed explicitly', () => {
		expect(validateMoneyTable(t([[1, 3], [2, 2], [3, -1]]), 3).ok).toBe(true);
	});
	it('reports each uncovered place when there is no catch-all', () => {
		const check = validateMoneyTable(t([[1, 3], [3, -1]]), 4);
		expect(check.ok).toBe(false);
		expect(check.problems.filter((p) => p.kind === 'uncovered').map((p) => p.place)).toEqual([2, 4]);
	});
	it('reports a duplicate place even with a catch-all', () => {
		const check = validateMoneyTable(t([[1, 3], [1, 4]], 0), 4);
		expect(check.ok).toBe(false);
		expect(check.problems).toMatchObject([{ kind: 'duplicate', place: 1, severity: 'error' }]);
	});
	it('warns about a place the field can never reach, without failing', () => {
		const check = validateMoneyTable(t([[1, 3], [7, 1]], -1), 6);
		expect(check.ok).toBe(true);
		expect(check.problems).toMatchObject([{ kind: 'unreachable', place: 7, severity: 'warning' }]);
	});
	it('looks up coins for a place', () => {
		const table = t([[1, 5]], -2);
		expect(coinsForPlace(table, 1)).toBe(5);
		expect(coinsForPlace(table, 4)).toBe(-2);
		expect(coinsForPlace(t([[1, 5]]), 2)).toBeUndefined();
	});
});

describe('card and kind schemas', () => {
	it('card data is told apart by its type', () => {
		const card = { id: 'c', kindId: 'k', name: 'A', copies: 2, data: { type: 'movement', runnerId: 'r', steps: 3 } };
		expect(CardSchema.safeParse(card).success).toBe(true);
		expect(CardSchema.safeParse({ ...card, data: { ...card.data, steps: 10 } }).success).toBe(false);
		expect(CardSchema.safeParse({ ...card, data: { type: 'rogue', runnerId: 'r' } }).success).toBe(false);
		expect(
			CardSchema.safeParse({ ...card, data: { type: 'modifier', name: 'M', effectText: '', steps: -2 } }).success
		).toBe(true);
	});
	it('keeps layout parameters the print engine adds (the params object is open)', () => {
		const kind = demoGame().kinds[0];
		const parsed = CardKindSchema.parse({ ...kind, params: { ...kind.params, ribbonMm: 4 } });
		expect(parsed.params.ribbonMm).toBe(4);
		expect(CardKindSchema.safeParse({ ...kind, params: { ...kind.params, backgroundHex: 'red' } }).success).toBe(false);
	});
});

describe('findReferenceProblems', () => {
	it('finds nothing wrong in the demo game', () => {
		const game = GameSchema.parse(demoGame());
		expect(findReferenceProblems(game)).toEqual([]);
	});
	it('finds a card of a missing runner, money table and kind, and data of the wrong type', () => {
		const game = demoGame();
		const mv = game.cards.findIndex((c) => c.data.type === 'movement');
		const wg = game.cards.findIndex((c) => c.data.type === 'wager');
		const st = game.cards.findIndex((c) => c.data.type === 'setup');
		game.cards[mv] = { ...game.cards[mv], data: { type: 'movement', runnerId: 'nobody', steps: 1 } };
		game.cards[wg] = { ...game.cards[wg], data: { ...(game.cards[wg].data as object), moneyTableId: 'gone' } as never };
		game.cards[st] = { ...game.cards[st], kindId: 'kd-movement' };
		game.cards.push({ ...game.cards[0], id: 'orphan', kindId: 'no-kind' });
		const paths = findReferenceProblems(game).map((p) => p.path);
		expect(paths).toEqual([
			`cards[${mv}].data.runnerId`,
			`cards[${wg}].data.moneyTableId`,
			`cards[${st}].data.type`,
			`cards[${game.cards.length - 1}].kindId`
		]);
	});
	it('finds duplicate ids and art assigned to nothing', () => {
		const game = demoGame();
		game.runners.push({ ...game.runners[0], name: 'Twin' });
		game.art.push({
			id: 'a1',
			sha256: '0'.repeat(64),
			mime: 'image/png',
			widthPx: 1,
			heightPx: 1,
			status: 'sketch',
			fileName: 'x.png',
			assignment: { scope: 'card', targetId: 'missing', slot: 'icon' }
		});
		const messages = findReferenceProblems(game).map((p) => p.message);
		expect(messages).toContain(`Id “${game.runners[0].id}” is used twice`);
		expect(messages).toContain('Art “x.png” is assigned to a missing card');
	});
});
