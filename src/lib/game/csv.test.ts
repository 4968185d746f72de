import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvColumns, diffCards, exportCardsCsv, importCardsCsv } from './csv';
import { demoGame } from '$lib/demo/demo';
import type { Card, CardKind } from './model';

const game = demoGame();
const ctx = { runners: game.runners, moneyTables: game.moneyTables };
const kind = (id: string) => game.kinds.find((k) => k.id === id)!;
const cardsOf = (k: CardKind) => game.cards.filter((c) => c.kindId === k.id);

describe('csv export', () => {
	it('writes name, copies and the data fields, runners by name', () => {
		const csv = exportCardsCsv(kind('kd-movement'), game.cards, ctx);
		const lines = csv.split('\r\n'); // RFC 4180 §2: CRLF between records
		expect(lines[0]).toBe('name,copies,runner,steps');
		expect(lines[1]).toBe('Rosehip 1,3,Rosehip,1');
		expect(lines).toHaveLength(1 + 18);
	});
	it('writes wager cards with the money table by name', () => {
		const csv = exportCardsCsv(kind('kd-wager'), game.cards, ctx);
		expect(csv.split('\r\n')[1]).toBe('Rosehip stage tier 1,1,stage,Rosehip,1,"Stage, first pick"');
	});
	it('protects spreadsheet users from text that looks like a formula', () => {
		const k = kind('kd-aid');
		const card: Card = { id: 'f', kindId: k.id, name: 'Sum', copies: 1, data: { type: 'custom', values: { title: '=1+1', body: '' } } };
		const csv = exportCardsCsv(k, [card], ctx);
		expect(csv.split('\r\n')[1]).toBe(`Sum,1,"'=1+1",`);
	});
	it('reads back in papaparse header mode as the same rows', () => {
		const csv = exportCardsCsv(kind('kd-hazard'), game.cards, ctx);
		const parsed = Papa.parse<Record<string, string>>(csv, { header: true });
		expect(parsed.errors).toEqual([]);
		expect(parsed.data[3]).toEqual({ name: 'Boot Print', copies: '1', modifierName: 'Boot Print', effectText: 'The snails that stop here slither three spaces back, under any stack there. Then lift the token.', steps: '-3' });
	});
});

describe('csv round trip', () => {
	it.each(game.kinds.map((k) => [k.name, k] as const))('%s: export then import gives the same cards', (_name, k) => {
		const csv = exportCardsCsv(k, game.cards, ctx);
		const result = importCardsCsv(csv, k, ctx);
		expect(result.errors).toEqual([]);
		expect(result.ok).toBe(true);
		expect(result.rows.map(({ name, copies, data }) => ({ name, copies, data }))).toEqual(
			cardsOf(k).map(({ name, copies, data }) => ({ name, copies, data }))
		);
		const diff = diffCards(game.cards, result.rows, k.id);
		expect(diff.unchanged).toHaveLength(cardsOf(k).length);
		expect([diff.added, diff.changed, diff.removed]).toEqual([[], [], []]);
	});
});

describe('csv import errors', () => {
	const k = kind('kd-movement');
	it('reports a bad row by its line number (header = line 1) and returns nothing to apply', () => {
		const csv = ['name,copies,runner,steps', 'A,2,Rosehip,1', 'B,2,Rosehip,12', 'C,2,Rosehip,3'].join('\n');
		const result = importCardsCsv(csv, k, ctx);
		expect(result.ok).toBe(false);
		expect(result.rows).toEqual([]);
		expect(result.errors).toHaveLength(1);
		expect(result.errors[0]).toMatchObject({ line: 3, column: 'steps' });
	});
	it('counts physical lines, across quoted line breaks and blank lines', () => {
		const csv = 'name,copies,runner,steps\r\n"Two\r\nline name",2,Rosehip,1\r\n\r\nD,x,Rosehip,2\r\n';
		const result = importCardsCsv(csv, k, ctx);
		expect(result.errors).toEqual([{ line: 5, column: 'copies', message: '“x” is not a number' }]);
		expect(result.rows).toEqual([]);
	});
	it('names an unknown runner and lists the known ones', () => {
		const result = importCardsCsv('name,copies,runner,steps\nA,1,Slowpoke,1', k, ctx);
		expect(result.errors[0]).toMatchObject({ line: 2, column: 'runner' });
		expect(result.errors[0].message).toContain('No runner is called “Slowpoke”');
	});
	it('refuses unknown, missing and doubled columns on line 1', () => {
		const result = importCardsCsv('name,copies,runer,steps,steps\nA,1,Rosehip,1,1', k, ctx);
		expect(result.errors.map((e) => [e.line, e.column])).toEqual([
			[1, 'runer'],
			[1, 'steps'],
			[1, 'runner']
		]);
	});
	it('refuses a row with the wrong number of cells, an empty cell, a fraction and a repeated name', () => {
		const csv = ['name,copies,runner,steps', 'A,1,Rosehip', 'B,,Rosehip,1', 'C,1.5,Rosehip,1', 'D,1,Rosehip,1', 'D,1,Saffron,1'].join('\n');
		const errors = importCardsCsv(csv, k, ctx).errors;
		expect(errors.map((e) => [e.line, e.column])).toEqual([
			[2, undefined],
			[3, 'copies'],
			[4, 'copies'],
			[6, 'name']
		]);
		expect(errors[3].message).toBe('“D” is already on line 5; names must differ');
	});
	it('refuses an unterminated quote', () => {
		const result = importCardsCsv('name,copies,runner,steps\n"A,1,Rosehip,1\n', k, ctx);
		expect(result.ok).toBe(false);
		expect(result.errors[0].line).toBe(2);
		expect(result.errors[0].message).toMatch(/never closed/);
	});
	it('says in plain words what is wrong with a stray quote mark, not the reader’s own wording', () => {
		const result = importCardsCsv('name,copies,runner,steps\n"A"x,1,Rosehip,1\n', k, ctx);
		expect(result.ok).toBe(false);
		expect(result.errors[0].message).toMatch(/more text after its closing quote mark/);
		expect(result.errors.map((e) => e.message).join(' ')).not.toMatch(/malformed|unterminated|CSV:/);
	});
	it('refuses an empty file and a header with no rows', () => {
		expect(importCardsCsv('', k, ctx).ok).toBe(false);
		expect(importCardsCsv('name,copies,runner,steps\n', k, ctx).errors[0].message).toMatch(/no data rows/);
	});
	it('validates with the model schemas (tile role, setup players)', () => {
		const tiles = importCardsCsv(
			'name,copies,number,role,spacesFront,spacesBack,backLabel\nT,1,1,middle,3,2,Narrow',
			kind('kd-tile'),
			ctx
		);
		expect(tiles.errors[0]).toMatchObject({ line: 2, column: 'role' });
		const setups = importCardsCsv(
			`${csvColumns(kind('kd-setup')).join(',')}\nS,1,1,5,3,8,2,2,14,0`,
			kind('kd-setup'),
			ctx
		);
		expect(setups.errors[0]).toMatchObject({ line: 2, column: 'players' });
	});
	it('reads setup files without the rogue-cards column, and an empty rogue-cards cell, as “not set”', () => {
		const old = importCardsCsv('name,copies,players,handSize,discards,toSharedDeck,faceUp,extraFromDeck,trackLength\nS,1,4,4,6,8,2,1,6', kind('kd-setup'), ctx);
		expect(old.errors).toEqual([]);
		expect(old.rows[0].data).toEqual({ type: 'setup', players: 4, handSize: 4, discards: 6, toSharedDeck: 8, faceUp: 2, extraFromDeck: 1, trackLength: 6 });
		const empty = importCardsCsv(`${csvColumns(kind('kd-setup')).join(',')}\nS,1,4,4,6,8,2,1,6,`, kind('kd-setup'), ctx);
		expect(empty.rows[0].data).not.toHaveProperty('rogueToDeck');
		const bad = importCardsCsv(`${csvColumns(kind('kd-setup')).join(',')}\nS,1,4,4,6,8,2,1,6,x`, kind('kd-setup'), ctx);
		expect(bad.errors[0]).toMatchObject({ line: 2, column: 'rogueToDeck' });
	});
	it('accepts a byte order mark and headers in any case', () => {
		const result = importCardsCsv('\uFEFFName,COPIES,Runner,Steps\nA,1,rosehip,1', k, ctx);
		expect(result.ok).toBe(true);
		expect(result.rows[0].data).toEqual({ type: 'movement', runnerId: 'rn-rosehip', steps: 1 });
	});
});

describe('diffCards', () => {
	it('sorts an import into added, changed, removed and unchanged by name', () => {
		const k = kind('kd-hazard');
		const csv = [
			'name,copies,modifierName,effectText,steps',
			'Dew Trail,3,Dew Trail,"The snails that stop here glide two spaces on, onto the top of any stack. Then lift the token.",2', // unchanged
			'Fallen Leaf,2,Fallen Leaf,"A downhill ride: the snails that stop here slide three spaces on, onto the top. Then lift the token.",3', // copies changed
			'Thistle Patch,3,Thistle Patch,Prickly!,-2', // effect changed
			'Moss Bed,1,Moss Bed,Soft and slow.,0' // new
		].join('\n'); // Boot Print removed
		const rows = importCardsCsv(csv, k, ctx).rows;
		const diff = diffCards(game.cards, rows, k.id, () => 'new-id');
		expect(diff.unchanged.map((c) => c.name)).toEqual(['Dew Trail']);
		expect(diff.changed.map((c) => [c.before.name, c.fields])).toEqual([
			['Fallen Leaf', ['copies']],
			['Thistle Patch', ['effectText']]
		]);
		expect(diff.changed[0].after).toMatchObject({ id: 'kd-hazard.hz-leaf', copies: 2 });
		expect(diff.added).toMatchObject([{ id: 'new-id', kindId: k.id, name: 'Moss Bed' }]);
		expect(diff.removed.map((c) => c.name)).toEqual(['Boot Print']);
	});
});
