import { imageSize } from 'image-size';
import { Jimp } from 'jimp';
import { beforeAll, describe, expect, it } from 'vitest';
import type { FaceLayout } from './display-list';
import { loadFonts, type FontSet } from './fonts';
import { mmToPx, renderFacePng, svgToPng } from './png';
import { renderSvg } from './svg';
import { fitText } from './text';

let fonts: FontSet;
beforeAll(async () => {
	fonts = await loadFonts();
});

/** Poker 63.5 × 88.9 mm with 1/8 in (3.175 mm) bleed: common practice; 1 in = 25.4 mm exactly. */
const pokerFace = (items: FaceLayout['items']): FaceLayout => ({
	trimWidthMm: 63.5,
	trimHeightMm: 88.9,
	bleedMm: 3.175,
	safeMm: 3.175,
	items,
	warnings: []
});

const white = { hex: '#ffffff' };
const background = { type: 'rect' as const, xMm: 0, yMm: 0, wMm: 69.85, hMm: 95.25, fill: white };

describe('svgToPng', () => {
	it('renders a poker card with 1/8 in bleed at 300 dpi as 825 × 1125 px', async () => {
		// 69.85 mm = 2.75 in → 825 px; 95.25 mm = 3.75 in → 1125 px (the brief's figure).
		const r = await renderFacePng(pokerFace([background]), new Map(), { dpi: 300 });
		expect([r.widthPx, r.heightPx]).toEqual([825, 1125]);
		// Read back by independent decoders.
		expect(imageSize(r.png)).toMatchObject({ width: 825, height: 1125, type: 'png' });
		const img = await Jimp.read(Buffer.from(r.png));
		expect([img.bitmap.width, img.bitmap.height]).toEqual([825, 1125]);
	});

	it('rounds each side on its own: a mini card with 3 mm bleed at 300 dpi is 591 × 874 px', async () => {
		// 50 mm / 25.4 × 300 = 590.55 → 591 px; 74 mm / 25.4 × 300 = 874.02 → 874 px (1 in = 25.4 mm).
		const mini = { ...pokerFace([]), trimWidthMm: 44, trimHeightMm: 68, bleedMm: 3, safeMm: 5 };
		const r = await renderFacePng({ ...mini, items: [{ ...background, wMm: 50, hMm: 74 }] }, new Map(), { dpi: 300 });
		expect(imageSize(r.png)).toMatchObject({ width: 591, height: 874 });
	});

	it('rounds to whole pixels from mm and dpi', () => {
		expect(mmToPx(25.4, 300)).toBe(300);
		expect(mmToPx(69.85, 300)).toBe(825);
		expect(mmToPx(210, 150)).toBe(1240); // A4 width (ISO 216) at 150 dpi: 1240.16 px
	});

	it('initialises resvg once even when many renders start together', async () => {
		const svg = renderSvg(pokerFace([background]), new Map());
		const all = await Promise.all([1, 2, 3].map(() => svgToPng(svg, { widthMm: 69.85, dpi: 30 })));
		expect(all.map((r) => r.widthPx)).toEqual([mmToPx(69.85, 30), mmToPx(69.85, 30), mmToPx(69.85, 30)]);
	});

	it('draws text with the shipped font: ink inside the text box, none outside it', async () => {
		const box = { xMm: 10, yMm: 30, wMm: 50, hMm: 14 };
		const fit = fitText(fonts, 'Hedgebottom', box, { maxPt: 28, minPt: 8, weight: 'bold', fill: { hex: '#000000' }, wrap: false });
		const dpi = 300;
		const r = await renderFacePng(pokerFace([background, ...fit.items]), new Map(), { dpi });
		const img = await Jimp.read(Buffer.from(r.png));
		const px = (mm: number) => Math.round((mm / 25.4) * dpi);
		let inside = 0;
		let outside = 0;
		const { width, height, data } = img.bitmap;
		for (let y = 0; y < height; y++)
			for (let x = 0; x < width; x++) {
				const i = (y * width + x) * 4;
				const dark = data[i] < 128 && data[i + 1] < 128 && data[i + 2] < 128;
				if (!dark) continue;
				const inBox = x >= px(box.xMm) - 1 && x <= px(box.xMm + box.wMm) + 1 && y >= px(box.yMm) - 1 && y <= px(box.yMm + box.hMm) + 1;
				if (inBox) inside++;
				else outside++;
			}
		// A bold word at this size covers thousands of pixels; a missing font would leave none.
		expect(inside).toBeGreaterThan(5000);
		expect(outside).toBe(0);
		// The ink spans close to the width fontkit measured (resvg shapes the same font).
		let minX = width,
			maxX = 0;
		for (let y = px(box.yMm); y < px(box.yMm + box.hMm); y++)
			for (let x = 0; x < width; x++) if (data[(y * width + x) * 4] < 128) ((minX = Math.min(minX, x)), (maxX = Math.max(maxX, x)));
		const inkMm = ((maxX - minX) / dpi) * 25.4;
		expect(inkMm).toBeGreaterThan(fit.widthMm * 0.9);
		expect(inkMm).toBeLessThanOrEqual(fit.widthMm + 0.5);
	});

	it('parses escaped text as well-formed XML and draws it', async () => {
		// resvg's XML reader rejects an unescaped "&" or "<": rendering at all proves the escaping.
		const fit = fitText(fonts, 'Rock & <Roll> "Co"', { xMm: 8, yMm: 20, wMm: 54, hMm: 12 }, { maxPt: 16, minPt: 8, fill: { hex: '#000000' } });
		const r = await renderFacePng(pokerFace([background, ...fit.items]), new Map(), { dpi: 100 });
		const img = await Jimp.read(Buffer.from(r.png));
		let dark = 0;
		for (let i = 0; i < img.bitmap.data.length; i += 4) if (img.bitmap.data[i] < 128) dark++;
		expect(dark).toBeGreaterThan(100);
	});
});
