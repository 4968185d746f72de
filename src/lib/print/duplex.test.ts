import { describe, expect, it } from 'vitest';
import { backShiftMm, backSlots, flipAxis } from './duplex';
import { impose, type Imposition } from './impose';
import { PAPER } from './paper';

const poker = { trimWidthMm: 63.5, trimHeightMm: 88.9, bleedMm: 3 };
function a4(orientation: 'portrait' | 'landscape'): Imposition {
	const r = impose({ sheet: PAPER.a4, marginMm: 5, ...poker, layout: 'butted', orientation });
	if (!r.ok) throw new Error(r.error);
	return r;
}

describe('duplex back pages', () => {
	it('turns about the long edge: columns swap on portrait, rows on landscape', () => {
		expect(flipAxis('long', 210, 297)).toBe('vertical');
		expect(flipAxis('long', 297, 210)).toBe('horizontal');
		expect(flipAxis('short', 210, 297)).toBe('horizontal');
		expect(flipAxis('short', 297, 210)).toBe('vertical');
	});

	it('puts each back in the mirrored column (long edge, portrait 3 × 3)', () => {
		const r = a4('portrait');
		const backs = backSlots(r, 'long');
		// Card in column 0 → back in column 2; x mirrored about the centre: 210 − 9.75 − 63.5 = 136.75,
		// which is exactly column 2's trim x (centring makes the mirror land on the grid).
		expect(backs[0].column).toBe(2);
		expect(backs[0].trimBox.xMm).toBeCloseTo(136.75, 9);
		expect(backs[0].trimBox.xMm).toBeCloseTo(r.slots[2].trimBox.xMm, 9);
		expect(backs[0].trimBox.yMm).toBeCloseTo(r.slots[0].trimBox.yMm, 9);
		// The outer bleed moves with it: the corner card's kept bleed is now on its right.
		expect(backs[0].clipBox.xMm + backs[0].clipBox.widthMm).toBeCloseTo(r.gridBox.xMm + r.gridBox.widthMm, 9);
	});

	it('puts each back in the mirrored row (short edge, portrait)', () => {
		const r = a4('portrait');
		const backs = backSlots(r, 'short');
		expect([backs[0].column, backs[0].row]).toEqual([0, 2]);
		expect(backs[0].trimBox.yMm).toBeCloseTo(r.slots[6].trimBox.yMm, 9);
	});

	it('cancels the printer offset with the sign the flip needs', () => {
		// Read from the front: the back lands 1.5 mm right and 0.5 mm low. Turned about a vertical axis,
		// front-view x is back-page −x, so the back page moves +1.5 in x; y is unchanged by the turn: −0.5.
		expect(backShiftMm({ xMm: 1.5, yMm: 0.5 }, 'vertical')).toEqual({ dxMm: 1.5, dyMm: -0.5 });
		expect(backShiftMm({ xMm: 1.5, yMm: 0.5 }, 'horizontal')).toEqual({ dxMm: -1.5, dyMm: 0.5 });
		const r = a4('portrait');
		const plain = backSlots(r, 'long');
		const moved = backSlots(r, 'long', { xMm: 1.5, yMm: 0.5 });
		expect(moved[4].trimBox.xMm - plain[4].trimBox.xMm).toBeCloseTo(1.5, 9);
		expect(moved[4].trimBox.yMm - plain[4].trimBox.yMm).toBeCloseTo(-0.5, 9);
	});
});
