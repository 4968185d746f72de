import { describe, expect, it } from 'vitest';
import { buildCalibrationPdf, calibrationSheetSize } from './calibration';
import { flipGrey, inkedPixelsMm, pdfinfoBoxes, pdftotext, qpdfCheck, rasterGrey, type GreyImage } from './testing/poppler';

/** Centre (mm) of the darkest run along a row (axis x) or column (axis y) inside a window. */
function darkCentre(img: GreyImage, axis: 'x' | 'y', atMm: number, fromMm: number, toMm: number): number {
	const s = img.dpi / 25.4;
	const fixed = Math.round(atMm * s);
	let sum = 0;
	let weight = 0;
	for (let p = Math.round(fromMm * s); p < Math.round(toMm * s); p++) {
		const v = axis === 'x' ? img.data[fixed * img.width + p] : img.data[p * img.width + fixed];
		const ink = 255 - v;
		if (ink > 60) (sum += ink * (p + 0.5)), (weight += ink);
	}
	return sum / weight / s;
}

describe('duplex calibration sheet', () => {
	for (const paper of ['a4', 'letter'] as const)
		for (const duplex of ['long', 'short'] as const)
			it(`${paper}, ${duplex} edge: two pages of the paper's size; the back's cross lands on the front's centre`, async () => {
				const bytes = await buildCalibrationPdf({ paper, duplex, marginMm: 5 });
				qpdfCheck(bytes);
				const { pages, boxes } = pdfinfoBoxes(bytes);
				expect(pages).toBe(2);
				// ISO 216 A4 595.276 × 841.890 pt; ANSI/ASME Y14.1 Letter 612 × 792 pt (pdfinfo -box).
				const want = paper === 'a4' ? [595.276, 841.89] : [612, 792];
				for (const b of boxes) {
					expect(Math.abs(b.media.x1 - want[0])).toBeLessThan(0.01);
					expect(Math.abs(b.media.y1 - want[1])).toBeLessThan(0.01);
				}
				const { widthMm: W, heightMm: H } = calibrationSheetSize({ paper });
				const dpi = 300;
				const back = flipGrey(rasterGrey(bytes, 2, dpi), duplex === 'long' ? 'vertical' : 'horizontal');
				// Turned over, the bold upright line sits on the sheet's centre (within 0.3 mm; a perfect printer reads 0).
				// Sampled 15 mm above / left of the centre, clear of the scales; pixel rounding of the page (see sheets.test) < 0.1 mm.
				expect(Math.abs(darkCentre(back, 'x', H / 2 - 15, W / 2 - 5, W / 2 + 5) - W / 2)).toBeLessThan(0.3);
				expect(Math.abs(darkCentre(back, 'y', W / 2 - 15, H / 2 - 5, H / 2 + 5) - H / 2)).toBeLessThan(0.3);
				// The back's scales, turned over, lie behind the front's: y scale 25 mm right of the centre,
				// x scale 25 mm below it (sampled between ticks, at 7.5 mm along each scale).
				expect(Math.abs(darkCentre(back, 'x', H / 2 + 7.5, W / 2 + 22, W / 2 + 28) - (W / 2 + 25))).toBeLessThan(0.3);
				expect(Math.abs(darkCentre(back, 'y', W / 2 + 7.5, H / 2 + 22, H / 2 + 28) - (H / 2 + 25))).toBeLessThan(0.3);
				// Nothing in the printer margin on either page.
				for (const page of [1, 2]) {
					const img = rasterGrey(bytes, page, 100);
					const m = 5 - 25.4 / 100;
					expect(inkedPixelsMm(img, 0, 0, W, m, 250) + inkedPixelsMm(img, 0, H - m, W, m, 250)).toBe(0);
					expect(inkedPixelsMm(img, 0, 0, m, H, 250) + inkedPixelsMm(img, W - m, 0, m, H, 250)).toBe(0);
				}
				const text = pdftotext(bytes).replace(/\s+/g, ' ');
				expect(text).toMatch(/back offset in your printer profile/);
				expect(text).toMatch(/actual size/);
			});

	it('fits landscape sheets too', async () => {
		const bytes = await buildCalibrationPdf({ paper: 'a3', orientation: 'landscape', duplex: 'short', marginMm: 5 });
		// ISO 216 A3 landscape: 420 × 297 mm = 1190.551 × 841.890 pt.
		const b = pdfinfoBoxes(bytes).boxes[0];
		expect(Math.abs(b.media.x1 - 1190.551)).toBeLessThan(0.01);
		expect(Math.abs(b.media.y1 - 841.89)).toBeLessThan(0.01);
	});
});
