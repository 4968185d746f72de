import { describe, expect, it } from 'vitest';
import { compareGames } from './compare';
import { demoGame } from '$lib/demo/demo';

describe('comparing two snapshots', () => {
	it('finds nothing between a game and itself', () => {
		const g = demoGame();
		const c = compareGames(g, structuredClone(g));
		expect(c.added).toEqual([]);
		expect(c.removed).toEqual([]);
		expect(c.changed).toEqual([]);
		expect(c.unchanged).toBe(g.cards.length);
	});

	it('lists exactly the cards a change reaches', () => {
		const before = demoGame();
		const after = structuredClone(before);
		// One card's copies change; one is removed; one is added.
		after.cards[0] = { ...after.cards[0], copies: after.cards[0].copies + 1 };
		const removed = after.cards.pop()!;
		after.cards.push({ ...after.cards[1], id: 'brand-new-card', name: 'Brand new' });
		// A money table change reaches every wager card that prints it.
		const table = after.moneyTables[0];
		after.moneyTables[0] = { ...table, rows: table.rows.map((r) => ({ ...r, coins: r.coins + 1 })) };
		const printing = after.cards.filter((c) => c.data.type === 'wager' && c.data.moneyTableId === table.id && c.id !== 'brand-new-card');

		const diff = compareGames(before, after);
		expect(diff.added.map((a) => a.cardId)).toEqual(['brand-new-card']);
		expect(diff.removed.map((r) => r.cardId)).toEqual([removed.id]);
		const changedIds = new Set(diff.changed.map((c) => c.cardId));
		expect(changedIds).toEqual(new Set([after.cards[0].id, ...printing.map((c) => c.id)]));
		expect(diff.changed.every((c) => c.parts.includes('data'))).toBe(true);
		// The fields say what changed inside each card.
		expect(diff.changed.find((c) => c.cardId === after.cards[0].id)!.fields).toContainEqual({
			field: 'card.copies',
			before: before.cards[0].copies,
			after: before.cards[0].copies + 1
		});
		const wager = diff.changed.find((c) => c.cardId === printing[0].id)!;
		expect(wager.fields.map((f) => f.field)).toEqual(table.rows.map((_, i) => `moneyTable.rows.${i + 1}.coins`));
	});

	it('tells art changes from data changes', () => {
		const before = demoGame();
		const after = structuredClone(before);
		const runnerId = after.runners[0].id;
		after.art = [
			{ id: 'a1', sha256: 'a'.repeat(64), mime: 'image/png', widthPx: 10, heightPx: 10, status: 'final', fileName: 'x.png', assignment: { scope: 'runner', targetId: runnerId, slot: 'portrait' } }
		];
		const diff = compareGames(before, after);
		expect(diff.changed.length).toBeGreaterThan(0);
		expect(diff.changed.every((c) => c.parts.join() === 'art')).toBe(true);
	});
});
