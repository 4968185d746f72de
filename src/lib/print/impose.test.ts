import { describe, expect, it } from 'vitest';
import { impose, printableBox, type Imposition } from './impose';
import { PAPER } from './paper';

// Poker card 63.5 × 88.9 mm (2.5 × 3.5 in, common practice), 3 mm metric bleed.
const poker = { trimWidthMm: 63.5, trimHeightMm: 88.9, bleedMm: 3 };

function ok(r: ReturnType<typeof impose>): Imposition {
	if (!r.ok) throw new Error(r.error);
	return r;
}

describe('impose', () => {
	it('puts nine poker cards butted on A4 portrait, centred', () => {
		// A4 is 210 × 297 mm (ISO 216); printer margin 5 mm leaves 200 × 287 mm.
		// Across: n·63.5 + 2·3 ≤ 200 → n ≤ 3.05 → 3 columns; grid 3·63.5 + 6 = 196.5 mm.
		// Down:   n·88.9 + 2·3 ≤ 287 → n ≤ 3.16 → 3 rows;    grid 3·88.9 + 6 = 272.7 mm.
		// Centred: x0 = (210 − 196.5)/2 = 6.75, y0 = (297 − 272.7)/2 = 12.15.
		const r = ok(impose({ sheet: PAPER.a4, marginMm: 5, ...poker, layout: 'butted', orientation: 'portrait' }));
		expect([r.columns, r.rows, r.cardsPerSheet]).toEqual([3, 3, 9]);
		expect(r.gridBox.widthMm).toBeCloseTo(196.5, 9);
		expect(r.gridBox.heightMm).toBeCloseTo(272.7, 9);
		expect(r.gridBox.xMm).toBeCloseTo(6.75, 9);
		expect(r.gridBox.yMm).toBeCloseTo(12.15, 9);
		// Same gap on both sides: 210 − (6.75 + 196.5) = 6.75.
		expect(r.sheetWidthMm - (r.gridBox.xMm + r.gridBox.widthMm)).toBeCloseTo(r.gridBox.xMm, 9);
		// Cut lines shared: x = 6.75 + 3 + k·63.5 → 9.75, 73.25, 136.75, 200.25; y = 12.15 + 3 + k·88.9.
		[9.75, 73.25, 136.75, 200.25].forEach((x, i) => expect(r.cutsXMm[i]).toBeCloseTo(x, 6));
		[15.15, 104.05, 192.95, 281.85].forEach((y, i) => expect(r.cutsYMm[i]).toBeCloseTo(y, 6));
		// Corner card keeps its outer bleed (left, top), loses the inner (right, bottom).
		const first = r.slots[0];
		expect(first.clipBox.xMm).toBeCloseTo(6.75, 9);
		expect(first.clipBox.yMm).toBeCloseTo(12.15, 9);
		expect(first.clipBox.widthMm).toBeCloseTo(66.5, 9); // 3 + 63.5
		expect(first.clipBox.heightMm).toBeCloseTo(91.9, 9); // 3 + 88.9
		// Middle card: clip = trim exactly, bleed box still trim + 3 mm each side for drawing.
		const mid = r.slots[4];
		expect(mid.clipBox).toEqual(mid.trimBox);
		expect(mid.bleedBox.widthMm).toBeCloseTo(69.5, 9);
		expect(mid.trimBox.xMm).toBeCloseTo(73.25, 9);
	});

	it('chooses portrait for butted poker on A4 when auto (9 beats landscape 8)', () => {
		// Landscape: 287 × 200 printable → ⌊(287 − 6)/63.5⌋ = 4 columns, ⌊(200 − 6)/88.9⌋ = 2 rows → 8.
		const land = ok(impose({ sheet: PAPER.a4, marginMm: 5, ...poker, layout: 'butted', orientation: 'landscape' }));
		expect([land.columns, land.rows]).toEqual([4, 2]);
		const auto = ok(impose({ sheet: PAPER.a4, marginMm: 5, ...poker, layout: 'butted' }));
		expect(auto.orientation).toBe('portrait');
		expect(auto.cardsPerSheet).toBe(9);
	});

	it('fits fewer on US Letter and turns it landscape', () => {
		// Letter is 215.9 × 279.4 mm (ANSI/ASME Y14.1, 8.5 × 11 in). Margin 5 → 205.9 × 269.4 printable.
		// Portrait: ⌊(205.9 − 6)/63.5⌋ = 3 columns, ⌊(269.4 − 6)/88.9⌋ = ⌊2.96⌋ = 2 rows → 6.
		// Landscape: ⌊(269.4 − 6)/63.5⌋ = 4 columns, ⌊(205.9 − 6)/88.9⌋ = 2 rows → 8.
		const portrait = ok(impose({ sheet: PAPER.letter, marginMm: 5, ...poker, layout: 'butted', orientation: 'portrait' }));
		expect([portrait.columns, portrait.rows]).toEqual([3, 2]);
		const r = ok(impose({ sheet: PAPER.letter, marginMm: 5, ...poker, layout: 'butted' }));
		expect(r.orientation).toBe('landscape');
		expect([r.columns, r.rows]).toEqual([4, 2]);
		expect(r.sheetWidthMm).toBeCloseTo(279.4, 9);
		// Grid 4·63.5 + 6 = 260 by 2·88.9 + 6 = 183.8; x0 = (279.4 − 260)/2 = 9.7; y0 = (215.9 − 183.8)/2 = 16.05.
		expect(r.gridBox.xMm).toBeCloseTo(9.7, 9);
		expect(r.gridBox.yMm).toBeCloseTo(16.05, 9);
		// A printer with a 3 mm margin: portrait height 273.4 → ⌊267.4/88.9⌋ = ⌊3.008⌋ = 3 rows → 9.
		const tight = ok(impose({ sheet: PAPER.letter, marginMm: 3, ...poker, layout: 'butted' }));
		expect([tight.orientation, tight.cardsPerSheet]).toEqual(['portrait', 9]);
	});

	it('spaces eight poker cards on A4 (landscape wins)', () => {
		// Spaced: each cell is 69.5 × 94.9 (trim + 2·3 bleed), gutter 2 mm between bleed boxes.
		// Portrait 200 × 287: ⌊(200 + 2)/71.5⌋ = 2 columns, ⌊(287 + 2)/96.9⌋ = 2 rows → 4.
		// Landscape 287 × 200: ⌊(287 + 2)/71.5⌋ = 4 columns, ⌊(200 + 2)/96.9⌋ = 2 rows → 8.
		const r = ok(impose({ sheet: PAPER.a4, marginMm: 5, ...poker, layout: 'spaced', gutterMm: 2 }));
		expect(r.orientation).toBe('landscape');
		expect([r.columns, r.rows, r.cardsPerSheet]).toEqual([4, 2, 8]);
		// Grid 4·69.5 + 3·2 = 284 wide → x0 = (297 − 284)/2 = 6.5; 2·94.9 + 2 = 191.8 tall → y0 = 9.1.
		expect(r.gridBox.xMm).toBeCloseTo(6.5, 9);
		expect(r.gridBox.yMm).toBeCloseTo(9.1, 9);
		// Second card: bleed box at 6.5 + 71.5 = 78, trim at 81; every card keeps its whole bleed.
		expect(r.slots[1].bleedBox.xMm).toBeCloseTo(78, 9);
		expect(r.slots[1].trimBox.xMm).toBeCloseTo(81, 9);
		expect(r.slots[1].clipBox).toEqual(r.slots[1].bleedBox);
		// Two cuts per column and per row, none shared.
		expect(r.cutsXMm.length).toBe(8);
		expect(r.cutsYMm.length).toBe(4);
	});

	it('lays out fold-and-glue pairs with the back mirrored about the fold line', () => {
		// A pair is 2·63.5 + 2·3 = 133 wide, 94.9 tall. Landscape 287 × 200: ⌊289/135⌋ = 2, ⌊202/96.9⌋ = 2 → 4 pairs.
		// Portrait 200 × 287: ⌊202/135⌋ = 1, ⌊289/96.9⌋ = 2 → 2 pairs.
		const r = ok(impose({ sheet: PAPER.a4, marginMm: 5, ...poker, layout: 'fold' }));
		expect(r.orientation).toBe('landscape');
		expect(r.cardsPerSheet).toBe(4);
		expect(r.slots.map((s) => s.side)).toEqual(['front', 'back', 'front', 'back', 'front', 'back', 'front', 'back']);
		// Grid 2·133 + 2 = 268 → x0 = (297 − 268)/2 = 14.5; first fold at 14.5 + 3 + 63.5 = 81.
		expect(r.foldsXMm[0]).toBeCloseTo(81, 9);
		const [front, back] = r.slots;
		// Mirror image about the fold: front's right trim edge = fold = back's left trim edge.
		expect(front.trimBox.xMm + front.trimBox.widthMm).toBeCloseTo(r.foldsXMm[0], 9);
		expect(back.trimBox.xMm).toBeCloseTo(r.foldsXMm[0], 9);
		// Bleed is clipped at the fold, kept on the three outer edges.
		expect(front.clipBox.xMm + front.clipBox.widthMm).toBeCloseTo(81, 9);
		expect(back.clipBox.xMm).toBeCloseTo(81, 9);
		expect(back.clipBox.widthMm).toBeCloseTo(66.5, 9);
		// The fold is not a cut: cuts are at each pair's outer trim edges only.
		expect(r.cutsXMm).not.toContain(81);
		expect(r.cutsXMm.length).toBe(4);
	});

	it('keeps room for crop marks when asked', () => {
		// 7 mm kept outside the bleed on every side: across 210 − 2·(5 + 7) = 186 → ⌊(186 − 6)/63.5⌋ = 2.
		const r = ok(impose({ sheet: PAPER.a4, marginMm: 5, ...poker, layout: 'butted', orientation: 'portrait', markSpaceMm: 7 }));
		expect(r.columns).toBe(2);
	});

	it('keeps every slot inside the printable area', () => {
		for (const sheet of [PAPER.a4, PAPER.a3, PAPER.letter, PAPER.tabloid])
			for (const layout of ['spaced', 'butted', 'fold'] as const) {
				const r = ok(impose({ sheet, marginMm: 4, ...poker, layout }));
				const p = printableBox(r);
				for (const s of r.slots) {
					expect(s.clipBox.xMm).toBeGreaterThanOrEqual(p.xMm - 1e-9);
					expect(s.clipBox.yMm).toBeGreaterThanOrEqual(p.yMm - 1e-9);
					expect(s.clipBox.xMm + s.clipBox.widthMm).toBeLessThanOrEqual(p.xMm + p.widthMm + 1e-9);
					expect(s.clipBox.yMm + s.clipBox.heightMm).toBeLessThanOrEqual(p.yMm + p.heightMm + 1e-9);
				}
			}
	});

	it('refuses a card larger than the printable area', () => {
		// Tarot 70 × 120 mm (common practice) fits A4, but not a 100 × 120 mm custom sheet with a 5 mm margin:
		// 120 + 6 = 126 > 120 − 10 = 110 either way round.
		const r = impose({ sheet: { widthMm: 100, heightMm: 120 }, marginMm: 5, trimWidthMm: 70, trimHeightMm: 120, bleedMm: 3, layout: 'spaced' });
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.error).toMatch(/larger than the printable area/);
		// Fold pairs of poker cards (133 mm wide) do not fit a 130 mm wide sheet in portrait.
		const fold = impose({ sheet: { widthMm: 130, heightMm: 200 }, marginMm: 0, ...poker, layout: 'fold', orientation: 'portrait' });
		expect(fold.ok).toBe(false);
	});
});
