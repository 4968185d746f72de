import { PDFDocument, rgb, StandardFonts } from 'pdf-lib';
import { describe, expect, it } from 'vitest';
import { impose, type BoxMm, type Imposition } from './impose';
import { CROP_MARK, drawSheetMarks, sheetMarks, type MarkLine } from './marks';
import { mmToPt, PAPER, PT_PER_MM } from './paper';
import { inkedPixelsMm, qpdfCheck, qpdfContents, rasterGrey } from './testing/poppler';

const poker = { trimWidthMm: 63.5, trimHeightMm: 88.9, bleedMm: 3 };
const imp = (sheet: { widthMm: number; heightMm: number }, layout: 'spaced' | 'butted' | 'fold', marginMm = 5) => {
	const r = impose({ sheet, marginMm, ...poker, layout });
	if (!r.ok) throw new Error(r.error);
	return r;
};
const lineBox = (l: MarkLine): BoxMm => ({
	xMm: Math.min(l.x1Mm, l.x2Mm),
	yMm: Math.min(l.y1Mm, l.y2Mm),
	widthMm: Math.abs(l.x2Mm - l.x1Mm),
	heightMm: Math.abs(l.y2Mm - l.y1Mm)
});
const overlaps = (a: BoxMm, b: BoxMm) =>
	a.xMm < b.xMm + b.widthMm && b.xMm < a.xMm + a.widthMm && a.yMm < b.yMm + b.heightMm && b.yMm < a.yMm + a.heightMm;
const inside = (a: BoxMm, r: Imposition) =>
	a.xMm >= r.marginMm - 1e-9 &&
	a.yMm >= r.marginMm - 1e-9 &&
	a.xMm + a.widthMm <= r.sheetWidthMm - r.marginMm + 1e-9 &&
	a.yMm + a.heightMm <= r.sheetHeightMm - r.marginMm + 1e-9;
const widthMm = (text: string, pt: number) => (text.length * pt * 0.55) / PT_PER_MM;
const fixedWidth = (text: string) => ({ texts: [text], widthMm });

describe('crop marks', () => {
	it('marks every cut line outside the bleed and inside the printable area (A4 butted poker)', () => {
		const r = imp(PAPER.a4, 'butted');
		const { lines } = sheetMarks(r, { cropMarks: true });
		// A4 butted: grid 196.5 × 272.7 at (6.75, 12.15). Room above: 12.15 − 0.5 − 5 = 6.65 → full 6 mm.
		// Room beside: 6.75 − 0.5 − 5 = 1.25 mm → marks shortened to 1.25 mm, still there.
		const vertical = lines.filter((l) => l.x1Mm === l.x2Mm);
		const horizontal = lines.filter((l) => l.y1Mm === l.y2Mm);
		expect(vertical.length).toBe(2 * r.cutsXMm.length); // top and bottom at each x cut
		expect(horizontal.length).toBe(2 * r.cutsYMm.length);
		for (const l of vertical) expect(Math.abs(l.y2Mm - l.y1Mm)).toBeCloseTo(6, 9);
		for (const l of horizontal) expect(Math.abs(l.x2Mm - l.x1Mm)).toBeCloseTo(1.25, 9);
		for (const l of lines) {
			expect(overlaps(lineBox(l), r.gridBox)).toBe(false); // never on a card or its bleed
			expect(inside(lineBox(l), r)).toBe(true); // never in the printer margin
		}
		// Offset from the trim edge is bleed + gap = 3.5 mm ≥ the 3 mm bleed (common practice: offset ≥ bleed).
		const topOfFirst = vertical.find((l) => l.x1Mm === r.cutsXMm[0] && l.y1Mm < r.gridBox.yMm)!;
		expect(r.cutsYMm[0] - topOfFirst.y1Mm).toBeCloseTo(3.5, 9);
		expect(r.cutsYMm[0] - topOfFirst.y1Mm).toBeGreaterThanOrEqual(r.bleedMm);
	});

	it('uses the full 6 mm where the sheet has room (A3)', () => {
		const r = imp(PAPER.a3, 'butted');
		const { lines } = sheetMarks(r, { cropMarks: true });
		for (const l of lines) expect(Math.hypot(l.x2Mm - l.x1Mm, l.y2Mm - l.y1Mm)).toBeCloseTo(CROP_MARK.lengthMm, 9);
	});

	it('places the label outside the cards, the marks and the printer margin', () => {
		for (const [sheet, layout] of [
			[PAPER.a4, 'butted'],
			[PAPER.a4, 'spaced'],
			[PAPER.letter, 'butted'],
			[PAPER.a3, 'fold']
		] as const) {
			const r = imp(sheet, layout);
			const m = sheetMarks(r, { cropMarks: true, label: fixedWidth('Snail Derby · proof 3 · sheet 1 of 2 · 2025-06-01') });
			expect(m.label, `${layout} on ${sheet.label}`).toBeDefined();
			const l = m.label!;
			const em = l.sizePt / PT_PER_MM;
			const box = { xMm: l.xMm, yMm: l.baselineMm - 0.95 * em, widthMm: widthMm(l.text, l.sizePt), heightMm: 1.18 * em };
			const where = `${layout} on ${sheet.label}: ${JSON.stringify({ l, box, grid: r.gridBox })}`;
			expect(inside(box, r), where).toBe(true);
			expect(overlaps(box, r.gridBox), where).toBe(false);
			for (const line of m.lines) expect(overlaps(box, lineBox(line)), where).toBe(false);
		}
	});

	it('adds dashed fold marks on the fold lines of a fold layout', () => {
		const r = imp(PAPER.a4, 'fold');
		const folds = sheetMarks(r, { cropMarks: false }).lines;
		expect(folds.every((l) => l.kind === 'fold')).toBe(true);
		expect(new Set(folds.map((l) => l.x1Mm))).toEqual(new Set(r.foldsXMm));
	});

	it('draws hairlines in registration colour where the imposition puts the cuts (pdftoppm, within 0.3 mm)', async () => {
		const r = imp(PAPER.a4, 'butted');
		const marks = sheetMarks(r, { cropMarks: true });
		const doc = await PDFDocument.create();
		const page = doc.addPage([mmToPt(r.sheetWidthMm), mmToPt(r.sheetHeightMm)]);
		drawSheetMarks(page, marks, r.sheetHeightMm, { font: await doc.embedFont(StandardFonts.Helvetica), labelColour: rgb(0, 0, 0) });
		const bytes = await doc.save();
		qpdfCheck(bytes);
		// ISO 32000-1 §8.6.8: "K" sets the stroking DeviceCMYK colour; 1 1 1 1 is all four inks.
		expect(qpdfContents(bytes)).toMatch(/1 1 1 1 K/);
		// ISO 32000-1 §8.4.3.2: "w" is the line width, 0.25 pt.
		expect(qpdfContents(bytes)).toMatch(/0\.25 w/);
		const img = rasterGrey(bytes, 1, 150);
		const pxMm = 25.4 / 150;
		// Scan a row through the top marks (2 mm above the grid) for dark runs; each run's centre is a mark.
		const scanRow = (yMm: number) => {
			const y = Math.round((yMm / 25.4) * 150);
			const found: number[] = [];
			let start = -1;
			for (let x = 0; x <= img.width; x++) {
				const dark = x < img.width && img.data[y * img.width + x] < 235;
				if (dark && start < 0) start = x;
				if (!dark && start >= 0) {
					found.push(((start + x) / 2) * pxMm);
					start = -1;
				}
			}
			return found;
		};
		const found = scanRow(r.gridBox.yMm - 2);
		expect(found.length).toBe(r.cutsXMm.length);
		found.forEach((x, i) => expect(Math.abs(x - r.cutsXMm[i])).toBeLessThanOrEqual(0.3));
		// Nothing inked in the printer margin (5 mm all round). Marks may end exactly on its edge, so the pixel
		// straddling the edge is left out: the margin is checked to 5 mm less one pixel.
		const m = 5 - pxMm;
		expect(inkedPixelsMm(img, 0, 0, r.sheetWidthMm, m, 250)).toBe(0);
		expect(inkedPixelsMm(img, 0, r.sheetHeightMm - m, r.sheetWidthMm, m, 250)).toBe(0);
		expect(inkedPixelsMm(img, 0, 0, m, r.sheetHeightMm, 250)).toBe(0);
		expect(inkedPixelsMm(img, r.sheetWidthMm - m, 0, m, r.sheetHeightMm, 250)).toBe(0);
	});
});
