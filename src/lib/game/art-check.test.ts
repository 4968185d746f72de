import { describe, expect, it } from 'vitest';
import { checkArtResolution, effectiveDpi, faceWithBleedMm, MIN_PRINT_DPI, pxForPrint } from './art-check';
import { cardSize } from './model';

describe('effective resolution', () => {
	it('poker with 1/8 in bleed at 300 dpi is 825 × 1125 px (product brief; 2.75 × 3.75 in × 300)', () => {
		const face = faceWithBleedMm(cardSize('poker'), 'us');
		// 63.5 + 2 × 3.175 = 69.85 mm = 2.75 in; 88.9 + 2 × 3.175 = 95.25 mm = 3.75 in.
		expect(face.widthMm).toBeCloseTo(69.85, 9);
		expect(face.heightMm).toBeCloseTo(95.25, 9);
		expect(pxForPrint(face.widthMm, 300)).toBe(825);
		expect(pxForPrint(face.heightMm, 300)).toBe(1125);
		expect(effectiveDpi(825, face.widthMm)).toBeCloseTo(300, 9);
		expect(checkArtResolution({ widthPx: 825, heightPx: 1125 }, face)).toMatchObject({ ok: true, warnings: [] });
	});
	it('one pixel fewer falls under the 300 dpi minimum (common practice)', () => {
		const face = faceWithBleedMm(cardSize('poker'), 'us');
		const check = checkArtResolution({ widthPx: 824, heightPx: 1125 }, face);
		expect(MIN_PRINT_DPI).toBe(300);
		expect(check.ok).toBe(false);
		expect(check.dpi).toBeCloseTo(824 / 2.75, 6);
		expect(check.neededPx).toEqual({ widthPx: 825, heightPx: 1125 });
		expect(check.warnings[0]).toMatch(/^Prints at 299 dpi/);
	});
	it('150 px across a 60 mm slot is 63.5 dpi', () => {
		// 60 mm = 2.3622 in; 150 / 2.3622 = 63.5.
		const check = checkArtResolution({ widthPx: 150, heightPx: 150 }, { widthMm: 60, heightMm: 60 });
		expect(check.dpi).toBeCloseTo(63.5, 6);
		expect(check.ok).toBe(false);
	});
	it('cover uses the tighter axis, contain the looser, and a shape mismatch is reported', () => {
		const slot = { widthMm: 25.4, heightMm: 25.4 };
		const cover = checkArtResolution({ widthPx: 600, heightPx: 300 }, slot);
		expect(cover.dpi).toBe(300);
		expect(cover.warnings).toEqual(["The image's shape differs from the slot's: 50% will be cropped"]);
		expect(checkArtResolution({ widthPx: 600, heightPx: 300 }, slot, { fit: 'contain' }).dpi).toBe(600);
	});
	it('vector art is never too coarse', () => {
		expect(checkArtResolution({ widthPx: 10, heightPx: 10, mime: 'image/svg+xml' }, { widthMm: 60, heightMm: 60 }).ok).toBe(true);
	});
	it('refuses a zero-size slot', () => expect(() => effectiveDpi(100, 0)).toThrow());
});
