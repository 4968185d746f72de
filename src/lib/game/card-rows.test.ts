import { describe, expect, it } from 'vitest';
import { demoGame } from '$lib/demo/demo';
import { cardColumns, cardRow, filterRows, sortRows } from './card-rows';

const game = demoGame();
const ctx = { runners: game.runners, rogue: game.rogueRunner, moneyTables: game.moneyTables };
const rowsOf = (kindId: string) => game.cards.filter((c) => c.kindId === kindId).map((c) => cardRow(c, ctx));

describe('card table rows', () => {
	it('shows runners and money tables by name, with the table’s payouts', () => {
		const row = rowsOf('kd-wager').find((r) => r.name === 'Rosehip stage tier 1')!;
		expect(row.cells).toMatchObject({ runner: 'Rosehip', tier: 1, moneyTable: 'Stage, first pick', pays: '1: +4 · 2: +2 · 3: 0 · others −3' });
		expect(cardColumns(game.kinds.find((k) => k.id === 'kd-aid')!).map((c) => c.key)).toEqual(['name', 'copies', 'field:title', 'field:body']);
	});

	it('sorts numbers as numbers and names in natural order (ECMA-402 collation with numeric: true)', () => {
		const tiles = rowsOf('kd-tile');
		expect(sortRows(tiles, 'name', 'ascending').slice(0, 3).map((r) => r.name)).toEqual(['Tile 1', 'Tile 2', 'Tile 3']);
		expect(sortRows(tiles, 'number', 'descending')[0].name).toBe('Tile 8');
	});

	it('keeps the rows holding every word of the filter', () => {
		const moves = rowsOf('kd-movement');
		// Demo movement cards are printed 3, 3 and 1 times, so “3” alone matches the copies too.
		expect(filterRows(moves, 'saffron 4').map((r) => r.name)).toEqual(['Saffron 4']);
		expect(filterRows(moves, 'SAFFRON')).toHaveLength(3);
		expect(filterRows(moves, '  ')).toHaveLength(moves.length);
	});
});
