import { describe, expect, it } from 'vitest';
import type { BoxMm } from './impose';
import { PAPER } from './paper';
import { planSheets, type SheetOptions } from './sheet-plan';
import { buildSheetPdf, type SheetPdfInput } from './sheets';
import { greyFor, numberedFace } from './testing/faces';
import {
	flipGrey,
	inkedPixelsMm,
	meanGreyMm,
	pdfinfoBoxes,
	pdftotext,
	qpdfCheck,
	qpdfContents,
	rasterGrey,
	type GreyImage
} from './testing/poppler';

const base: SheetOptions = {
	paper: 'a4',
	marginMm: 5,
	layout: 'butted',
	duplex: 'long',
	marks: true,
	sets: 1,
	backOffsetMm: { xMm: 0, yMm: 0 },
	colour: 'rgb',
	cuttingGuide: false
};

/** n numbered tiles whose fronts and backs differ per tile (like track tiles). */
function tiles(n: number): SheetPdfInput['faces'] {
	return Array.from({ length: n }, (_, i) => ({
		kindKey: 'tile',
		front: numberedFace(i, n, 'front'),
		back: numberedFace(i, n, 'back'),
		copies: 1
	}));
}

function input(options: Partial<SheetOptions>, faces = tiles(9)): SheetPdfInput {
	return { title: 'Snail Derby', versionLabel: 'proof 3', date: '2025-06-01', faces, options: { ...base, ...options } };
}

/** A patch in the lower half of a card, clear of its text and corner block. */
const patch = (t: BoxMm) => [t.xMm + t.widthMm * 0.3, t.yMm + t.heightMm * 0.7, t.widthMm * 0.4, t.heightMm * 0.15] as const;

describe('imposed sheet PDF', () => {
	it('makes A4 pages of ISO 216 size, passes qpdf --check, and labels every sheet', async () => {
		const bytes = await buildSheetPdf(input({ cuttingGuide: true }, tiles(12)));
		qpdfCheck(bytes); // qpdf --check: no structural errors (ISO 32000-1 file structure)
		const { pages, boxes } = pdfinfoBoxes(bytes);
		// 12 tiles at 9 per sheet → 2 sheets, each front + back, then the cutting guide.
		expect(pages).toBe(5);
		for (const b of boxes) {
			// ISO 216 A4 = 210 × 297 mm = 595.276 × 841.890 pt (1 pt = 1/72 in, ISO 32000-1 §8.3.2.3); pdfinfo -box.
			expect(Math.abs(b.media.x1 - b.media.x0 - 595.276)).toBeLessThan(0.01);
			expect(Math.abs(b.media.y1 - b.media.y0 - 841.89)).toBeLessThan(0.01);
		}
		const text = pdftotext(bytes).replace(/\s+/g, ' ');
		expect(text).toContain('Front 1');
		expect(text).toContain('sheet 2 of 2 back');
		// The cautions on the cutting guide.
		expect(text).toMatch(/cut away from yourself/);
		expect(text).toMatch(/metal ruler/);
		expect(text).toMatch(/away from children/);
		expect(text).toMatch(/print shop/);
	});

	it('turns US Letter landscape when that fits more, at ANSI/ASME Y14.1 size', async () => {
		const bytes = await buildSheetPdf(input({ paper: 'letter' }, tiles(8)));
		qpdfCheck(bytes);
		const { boxes } = pdfinfoBoxes(bytes);
		// Letter 11 × 8.5 in landscape = 792 × 612 pt (ANSI/ASME Y14.1; 72 pt per inch).
		expect(Math.abs(boxes[0].media.x1 - 792)).toBeLessThan(0.01);
		expect(Math.abs(boxes[0].media.y1 - 612)).toBeLessThan(0.01);
	});

	it('leaves the printer margin blank on every page and inks the text', async () => {
		const bytes = await buildSheetPdf(input({ cuttingGuide: true }, tiles(9)));
		for (const page of [1, 2, 3]) {
			const img = rasterGrey(bytes, page, 150);
			const m = 5 - 25.4 / 150; // the pixel straddling the margin edge is left out
			const W = PAPER.a4.widthMm;
			const H = PAPER.a4.heightMm;
			expect(inkedPixelsMm(img, 0, 0, W, m, 250), `page ${page} top`).toBe(0);
			expect(inkedPixelsMm(img, 0, H - m, W, m, 250), `page ${page} bottom`).toBe(0);
			expect(inkedPixelsMm(img, 0, 0, m, H, 250), `page ${page} left`).toBe(0);
			expect(inkedPixelsMm(img, W - m, 0, m, H, 250), `page ${page} right`).toBe(0);
		}
		// The label under the grid has ink (vector text in the embedded font, rendered by poppler).
		const plan = planSheets(input({}));
		const g = plan.groups[0].imposition.gridBox;
		const img = rasterGrey(bytes, 1, 150);
		expect(inkedPixelsMm(img, 73.25 + 1, g.yMm + g.heightMm + 0.5, 63.5 - 2, 297 - 5 - (g.yMm + g.heightMm + 0.5), 160)).toBeGreaterThan(30);
	});

	it('puts crop marks where the imposition says (pdftoppm, within 0.3 mm)', async () => {
		const bytes = await buildSheetPdf(input({}));
		const imp = planSheets(input({})).groups[0].imposition;
		const img = rasterGrey(bytes, 1, 150);
		const pxMm = 25.4 / 150;
		const darkRuns = (yMm: number) => {
			const y = Math.round((yMm / 25.4) * 150);
			const out: number[] = [];
			let start = -1;
			for (let x = 0; x <= img.width; x++) {
				const dark = x < img.width && img.data[y * img.width + x] < 235;
				if (dark && start < 0) start = x;
				if (!dark && start >= 0) out.push(((start + x) / 2) * pxMm), (start = -1);
			}
			return out;
		};
		// 2 mm above the grid's outer bleed: only the marks are there.
		const found = darkRuns(imp.gridBox.yMm - 2);
		expect(found.length).toBe(imp.cutsXMm.length);
		found.forEach((x, i) => expect(Math.abs(x - imp.cutsXMm[i])).toBeLessThanOrEqual(0.3));
	});

	/**
	 * Prints a duplex sheet "on paper": renders the back page, turns it over as the printer does
	 * (a mirror about the flip axis), and checks that each card's back lies behind its own front.
	 */
	async function checkBacksBehindFronts(options: Partial<SheetOptions>, flip: 'vertical' | 'horizontal', n: number) {
		const inp = input(options, tiles(n));
		const bytes = await buildSheetPdf(inp);
		qpdfCheck(bytes);
		const group = planSheets(inp).groups[0];
		const front = rasterGrey(bytes, 1, 100);
		const back = flipGrey(rasterGrey(bytes, 2, 100), flip);
		const perSheet = group.imposition.cardsPerSheet;
		for (const card of group.pages[0].cards) {
			const i = group.imposition.slots.filter((s) => s.side === 'front').indexOf(card.slot);
			const expected = greyFor(i, n);
			const f = meanGreyMm(front, ...patch(card.slot.trimBox));
			const b = meanGreyMm(back, ...patch(card.slot.trimBox));
			// Same tile on both sides; neighbours differ by 170/(n − 1) ≥ 15 levels, so ±4 tells them apart.
			expect(Math.abs(f - expected), `front of tile ${i + 1}`).toBeLessThan(4);
			expect(Math.abs(b - expected), `back of tile ${i + 1} behind its front`).toBeLessThan(4);
		}
		expect(group.pages[0].cards.length).toBe(Math.min(n, perSheet));
	}

	it('long-edge duplex on portrait A4: backs land behind their fronts once the sheet is turned left–right', async () => {
		await checkBacksBehindFronts({ duplex: 'long' }, 'vertical', 9);
	});

	it('short-edge duplex on portrait A4: backs land behind their fronts once the sheet is turned top–bottom', async () => {
		await checkBacksBehindFronts({ duplex: 'short' }, 'horizontal', 9);
	});

	it('long-edge duplex on landscape Letter turns about the long (top) edge', async () => {
		await checkBacksBehindFronts({ duplex: 'long', paper: 'letter', layout: 'spaced' }, 'horizontal', 6);
	});

	it('short-edge duplex on landscape Letter turns about the short (side) edge', async () => {
		await checkBacksBehindFronts({ duplex: 'short', paper: 'letter', layout: 'spaced' }, 'vertical', 6);
	});

	it('moves the back page to cancel a measured printer offset', async () => {
		// The printer puts backs 1.5 mm right and 0.8 mm low, read from the front (calibration sheet).
		const offset = { xMm: 1.5, yMm: 0.8 };
		for (const duplex of ['long', 'short'] as const) {
			const inp = input({ layout: 'spaced', duplex, backOffsetMm: offset }, tiles(4));
			const bytes = await buildSheetPdf(inp);
			const imp = planSheets(inp).groups[0].imposition;
			const flip = duplex === 'long' ? 'horizontal' : 'vertical'; // A4 spaced poker goes landscape
			expect(imp.orientation).toBe('landscape');
			const dpi = 300;
			const front = rasterGrey(bytes, 1, dpi);
			const back = flipGrey(rasterGrey(bytes, 2, dpi), flip);
			// Edges of the first card's bleed box (white gutter/paper outside it), scanned on both sides.
			const card = imp.slots[0].bleedBox;
			const edgeX = (img: GreyImage) => firstDark(img, 'x', card.yMm + card.heightMm * 0.8, card.xMm - 4, card.xMm + 4);
			const edgeY = (img: GreyImage) => firstDark(img, 'y', card.xMm + card.widthMm * 0.8, card.yMm - 4, card.yMm + 4);
			// After the printer adds its +1.5 / +0.8, the back's edges coincide with the front's:
			// so on the turned page they must sit 1.5 mm left of and 0.8 mm above the front's.
			// pdftoppm rounds the page up to whole pixels (2481 px for 210 mm at 300 dpi), so mirroring the
			// raster turns it about a line a little off the page's centre; take that slack back out.
			const s = dpi / 25.4;
			const slackX = flip === 'vertical' ? back.width / s - imp.sheetWidthMm : 0;
			const slackY = flip === 'horizontal' ? back.height / s - imp.sheetHeightMm : 0;
			// Edges are found to a fraction of a pixel (0.085 mm at 300 dpi); allow 0.1 mm.
			expect(Math.abs(edgeX(front) - card.xMm)).toBeLessThan(0.1);
			expect(Math.abs(edgeY(front) - card.yMm)).toBeLessThan(0.1);
			expect(Math.abs(edgeX(back) - slackX - (card.xMm - offset.xMm))).toBeLessThan(0.1);
			expect(Math.abs(edgeY(back) - slackY - (card.yMm - offset.yMm))).toBeLessThan(0.1);
		}
	});

	it('puts different card sizes on separate sheets', () => {
		const mini = { trimWidthMm: 44, trimHeightMm: 68 };
		const faces = [
			...tiles(3),
			{ kindKey: 'token', front: numberedFace(0, 2, 'front', mini), copies: 5 },
			{ kindKey: 'tile-extra', front: numberedFace(1, 3, 'front'), copies: 2 }
		];
		const plan = planSheets(input({ duplex: 'none' }, faces));
		expect(plan.groups.map((g) => g.kindKeys)).toEqual([['tile', 'tile-extra'], ['token']]);
		expect(plan.groups[1].pages[0].cards.every((c) => c.face.trimWidthMm === 44)).toBe(true);
		expect(plan.groups[0].cardCount).toBe(5);
		// Two sets double every count.
		expect(planSheets(input({ duplex: 'none', sets: 2 }, faces)).groups[1].cardCount).toBe(10);
	});

	it('writes only CMYK colour operators in cmyk mode (ISO 32000-1 §8.6.8: k/K, not rg/RG)', async () => {
		const bytes = await buildSheetPdf(input({ colour: 'cmyk', cuttingGuide: true }, tiles(2)));
		const text = qpdfContents(bytes);
		expect(text).toMatch(/ k\n/);
		expect(text).not.toMatch(/ (rg|RG)\n/);
	});

	it('fold layout: front and back side by side on one page, mirrored about the fold', async () => {
		const inp = input({ layout: 'fold', duplex: 'none' }, tiles(4));
		const bytes = await buildSheetPdf(inp);
		qpdfCheck(bytes);
		expect(pdfinfoBoxes(bytes).pages).toBe(1);
		const imp = planSheets(inp).groups[0].imposition;
		const img = rasterGrey(bytes, 1, 100);
		const slots = imp.slots;
		for (let i = 0; i < 4; i++) {
			const f = meanGreyMm(img, ...patch(slots[2 * i].trimBox));
			const b = meanGreyMm(img, ...patch(slots[2 * i + 1].trimBox));
			expect(Math.abs(f - greyFor(i, 4))).toBeLessThan(4);
			expect(Math.abs(b - greyFor(i, 4))).toBeLessThan(4);
		}
		expect(pdftotext(bytes)).toMatch(/fold on the dashed marks/);
	});

	it('refuses a card larger than the printable area', async () => {
		// 200 × 290 + 3 mm bleed = 206 × 296 mm: more than A4's 200 × 287 printable either way round.
		const big = { trimWidthMm: 200, trimHeightMm: 290 };
		await expect(buildSheetPdf(input({}, [{ kindKey: 'board', front: numberedFace(0, 1, 'front', big), copies: 1 }]))).rejects.toThrow(
			/larger than the printable area/
		);
	});
});

/**
 * Where (mm) a row (axis x) or column (axis y) first turns from paper to ink: the point where the
 * grey crosses halfway between paper and the darkest card (tile 1, grey 40), interpolated between
 * pixel centres so the edge is found to a fraction of a pixel.
 */
function firstDark(img: GreyImage, axis: 'x' | 'y', atMm: number, fromMm: number, toMm: number): number {
	const s = img.dpi / 25.4;
	const fixed = Math.round(atMm * s);
	const at = (p: number) => (axis === 'x' ? img.data[fixed * img.width + p] : img.data[p * img.width + fixed]);
	const mid = (255 + 40) / 2;
	for (let p = Math.round(fromMm * s) + 1; p < Math.round(toMm * s); p++) {
		if (at(p) < mid) {
			const a = at(p - 1);
			const b = at(p);
			return (p - 0.5 + (a - mid) / (a - b)) / s;
		}
	}
	throw new Error('no edge found');
}
