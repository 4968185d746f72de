import { describe, expect, it } from 'vitest';
import { differenceCiede2000 } from 'culori';
import { demoGame } from '../demo/demo';
import { closestVision, readiness, MIN_COLOUR_DELTA_E } from './readiness';
import { newRunnerDefaults } from './runner-defaults';
import type { Game } from './model';

const codes = (g: Game) => readiness(g).map((i) => i.code);

describe('readiness list', () => {
	it('a runner with movement cards but no wager cards is listed, with a link target', () => {
		const game = demoGame();
		const before = readiness(game).filter((i) => i.code === 'no-wager').length;
		const newcomer = { ...game.runners[0], id: 'newcomer', name: 'Newcomer', sortOrder: 99, symbol: game.runners[0].symbol };
		game.runners.push(newcomer);
		for (const c of game.cards.filter((c) => c.data.type === 'movement' && c.data.runnerId === game.runners[0].id))
			game.cards.push({ ...c, id: `${c.id}-n`, name: `${c.name} n`, data: { ...c.data, runnerId: 'newcomer' } as typeof c.data });
		const items = readiness(game);
		const noWager = items.filter((i) => i.code === 'no-wager');
		expect(noWager.length).toBeGreaterThan(before);
		expect(noWager.every((i) => i.ref?.id === 'newcomer')).toBe(true);
		// A copy of another runner's colour and symbol: both flagged.
		expect(codes(game)).toEqual(expect.arrayContaining(['same-symbol', 'close-colours']));
		// A field of one more runner leaves the tables one place short.
		expect(codes(game)).toContain('table-gap');
	});

	it('colours: ΔE follows CIEDE2000 (Sharma, Wu & Dalal 2005 test pair 1: 2.0425)', () => {
		// Lab (50, 2.6772, -79.7751) vs (50, 0, -82.7485): the first pair of the published test data.
		const d = differenceCiede2000()({ mode: 'lab65', l: 50, a: 2.6772, b: -79.7751 }, { mode: 'lab65', l: 50, a: 0, b: -82.7485 });
		expect(d).toBeCloseTo(2.0425, 3);
		// A red and a green of equal lightness look alike to red-green colour-blind eyes.
		const rg = closestVision('#b5651d', '#5a8f29');
		expect(rg.deltaE).toBeLessThan(MIN_COLOUR_DELTA_E * 2);
		expect(closestVision('#000000', '#ffffff').deltaE).toBeGreaterThan(90);
	});

	it('art still marked sketch, under 300 dpi or cropped by more than a third is listed', () => {
		const game = demoGame();
		const kind = game.kinds.find((k) => k.type === 'movement')!;
		game.art.push({
			id: 'a-small',
			sha256: 'b'.repeat(64),
			mime: 'image/png',
			widthPx: 300,
			heightPx: 100,
			status: 'sketch',
			fileName: 'small.png',
			assignment: { scope: 'kind', targetId: kind.id, slot: kind.artSlots[0] ?? 'portrait' }
		});
		// 300 × 100 px in a 40 × 40 mm slot: 63.5 dpi (25.4 mm an inch), aspect 3:1 so two thirds cropped.
		const printed = new Map([['a-small', { dpi: 63.5, ok: false, aspectRatio: 3 }]]);
		const mine = readiness(game, printed).filter((i) => i.ref?.id === 'a-small');
		expect(mine.map((i) => i.code).sort()).toEqual(['cropped-art', 'low-dpi', 'unfinished-art']);
		expect(mine.find((i) => i.code === 'low-dpi')?.message).toContain('63 dpi');
		// Art that prints nowhere is not about to be printed.
		expect(readiness(game).some((i) => i.ref?.id === 'a-small')).toBe(false);
	});
});

describe('a new runner', () => {
	it('gets an unused symbol and order, and a colour far from the others', () => {
		const game = demoGame();
		const d = newRunnerDefaults(game);
		expect(game.runners.map((r) => r.symbol)).not.toContain(d.symbol);
		expect(game.runners.map((r) => r.sortOrder)).not.toContain(d.sortOrder);
		for (const r of game.runners) expect(closestVision(d.colourHex, r.colourHex).deltaE).toBeGreaterThan(5);
	});
});
