import { beforeAll, describe, expect, it } from 'vitest';
import { coinsForPlace, type Game } from '../../game/model';
import type { TextItem as Item } from '../display-list';
import { loadFonts, type FontSet } from '../fonts';
import { layoutFace } from './index';
import { testGame } from './test-game';
import { formatCoins, moneyLines, ordinal } from './wager';

let fonts: FontSet;
let game: Game;
beforeAll(async () => {
	fonts = await loadFonts();
	game = testGame();
});

const texts = (items: { type: string }[]) => items.filter((i): i is Item => i.type === 'text');

function wagerFace(cardId: string) {
	const card = game.cards.find((c) => c.id === cardId)!;
	const kind = game.kinds.find((k) => k.id === card.kindId)!;
	return layoutFace({ game, kind, card, side: 'front', fonts });
}

describe('ordinal and coins', () => {
	it('writes English ordinals', () => {
		expect([1, 2, 3, 4, 11, 12, 13, 21, 22, 101, 111].map(ordinal)).toEqual([
			'1st', '2nd', '3rd', '4th', '11th', '12th', '13th', '21st', '22nd', '101st', '111th'
		]);
	});

	it('signs coins with a true minus sign (U+2212), plus for gains', () => {
		expect([formatCoins(5), formatCoins(0), formatCoins(-2)]).toEqual(['+5', '0', '\u22122']);
	});
});

describe('wager face', () => {
	it('prints every row of its money table: place and coins on one line', () => {
		const face = wagerFace('wg-win-saffron-2');
		expect(face.warnings).toEqual([]);
		const items = texts(face.items);
		const table = game.moneyTables.find((t) => t.id === 'mt-winner-2')!;
		for (let place = 1; place <= table.rows.length; place++) {
			const label = items.find((t) => t.text === ordinal(place));
			expect(label, `place ${place}`).toBeDefined();
			// The coins on the same baseline, to the right of the place.
			const coins = items.find((t) => Math.abs(t.yMm - label!.yMm) < 1e-6 && t.xMm > label!.xMm && t !== label);
			expect(coins?.text).toBe(formatCoins(coinsForPlace(table, place)!));
		}
		// Negative coins carry the minus sign.
		expect(items.some((t) => t.text === '\u22122')).toBe(true);
		// Rows go down the card in place order.
		const ys = [1, 2, 3, 4, 5].map((p) => items.find((t) => t.text === ordinal(p))!.yMm);
		expect([...ys].sort((a, b) => a - b)).toEqual(ys);
	});

	it('prints the "every other place" coins after the listed places', () => {
		const face = wagerFace('wg-stage-ember-1');
		const items = texts(face.items);
		const table = game.moneyTables.find((t) => t.id === 'mt-stage-1')!;
		const lines = moneyLines(table, 'any other');
		expect(lines.map((l) => l.label)).toEqual(['1st', '2nd', '3rd', 'any other']);
		for (const line of lines) {
			const label = items.find((t) => t.text === line.label)!;
			expect(label).toBeDefined();
			expect(items.some((t) => t.yMm === label.yMm && t.text === formatCoins(line.coins))).toBe(true);
		}
		expect(items.some((t) => t.text === '\u22123')).toBe(true);
	});

	it('shows the bet, the runner and the tier', () => {
		const items = texts(wagerFace('wg-stage-ember-1').items).map((t) => t.text);
		expect(items).toContain('Leads the stage');
		expect(items).toContain('Ember');
		expect(items).toContain('1');
		expect(items).toContain('tier');
	});

	it('sets a long table in two columns on a small card, every row still printed', () => {
		const g = testGame();
		const t = g.moneyTables.find((m) => m.id === 'mt-winner-2')!;
		t.rows = Array.from({ length: 12 }, (_, i) => ({ place: i + 1, coins: 6 - i }));
		const kind = { ...g.kinds.find((k) => k.id === 'k-wager')!, size: { preset: 'mini' as const, widthMm: 44, heightMm: 68 } };
		const card = g.cards.find((c) => c.id === 'wg-win-saffron-2')!;
		const face = layoutFace({ game: g, kind, card, side: 'front', fonts });
		expect(face.warnings).toEqual([]);
		const items = texts(face.items);
		for (const r of t.rows) expect(items.some((i) => i.text === ordinal(r.place))).toBe(true);
		expect(items.filter((i) => i.text === 'place')).toHaveLength(2);
		// Same size on every row.
		expect(new Set(items.filter((i) => /^\d+(st|nd|rd|th)$/.test(i.text)).map((i) => i.sizePt)).size).toBe(1);
	});

	it('warns when a table cannot fit even in two columns', () => {
		const g = testGame();
		const t = g.moneyTables.find((m) => m.id === 'mt-winner-2')!;
		t.rows = Array.from({ length: 12 }, (_, i) => ({ place: i + 1, coins: 6 - i }));
		const kind = { ...g.kinds.find((k) => k.id === 'k-wager')!, size: { preset: 'custom' as const, widthMm: 44, heightMm: 40 } };
		const card = g.cards.find((c) => c.id === 'wg-win-saffron-2')!;
		const face = layoutFace({ game: g, kind, card, side: 'front', fonts });
		expect(face.warnings.join('\n')).toMatch(/money table “Race winner, second taker” needs .* mm for its 12 rows/);
	});
});
