import { describe, expect, it } from 'vitest';
import { CSS_PX_PER_MM, clickToMm, centreMm, faceMmFromImage, insideFace, pinPercent } from './pin';

// Poker trim 2.5 × 3.5 in (common practice), with 1/8 in bleed per side (common practice in the US):
// the face box is 2.75 × 3.75 in. 1 in = 25.4 mm exactly (international yard and pound, 1959).
const usPoker = { widthMm: 2.75 * 25.4, heightMm: 3.75 * 25.4 };
// Metric: the same trim, 63.5 × 88.9 mm, with 3 mm bleed per side.
const metricPoker = { widthMm: 63.5 + 6, heightMm: 88.9 + 6 };

describe('pin positions', () => {
	it('read a face size from the image of its SVG: 96 CSS px per inch (CSS Values and Units Level 3)', () => {
		expect(CSS_PX_PER_MM * 25.4).toBeCloseTo(96, 10);
		// 2.75 in × 96 = 264 px, 3.75 in × 96 = 360 px.
		const face = faceMmFromImage(264, 360);
		expect(face.widthMm).toBeCloseTo(usPoker.widthMm, 6);
		expect(face.heightMm).toBeCloseTo(usPoker.heightMm, 6);
	});

	it('put a click in mm of the face box, whatever size the face is drawn at', () => {
		for (const scale of [1, 2.5, 4]) {
			const box = { left: 120, top: 40, width: metricPoker.widthMm * scale, height: metricPoker.heightMm * scale };
			// The trim's top-left corner is one bleed (3 mm) in from the face's top-left.
			expect(clickToMm(120 + 3 * scale, 40 + 3 * scale, box, metricPoker)).toEqual({ xMm: 3, yMm: 3 });
			// The far corner of the face box.
			expect(clickToMm(120 + box.width, 40 + box.height, box, metricPoker)).toEqual({ xMm: 69.5, yMm: 94.9 });
		}
	});

	it('place a pin back where it was clicked', () => {
		const box = { left: 0, top: 0, width: 300, height: (300 * usPoker.heightMm) / usPoker.widthMm };
		const at = clickToMm(150, 100, box, usPoker);
		const p = pinPercent(at.xMm, at.yMm, usPoker);
		expect((p.left / 100) * box.width).toBeCloseTo(150, 0);
		expect((p.top / 100) * box.height).toBeCloseTo(100, 0);
	});

	it('start a keyboard pin at the centre, and know the face edges', () => {
		expect(centreMm(metricPoker)).toEqual({ xMm: 34.8, yMm: 47.5 });
		expect(insideFace(0, 0, metricPoker)).toBe(true);
		expect(insideFace(69.5, 94.9, metricPoker)).toBe(true);
		expect(insideFace(69.6, 10, metricPoker)).toBe(false);
		expect(insideFace(-0.1, 10, metricPoker)).toBe(false);
	});
});
