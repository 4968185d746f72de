import { PDFDocument } from 'pdf-lib';
import { describe, expect, it } from 'vitest';
import { mmToPt, PAPER, paperSize, ptToMm } from './paper';
import { pdfinfoBoxes, qpdfCheck } from './testing/poppler';

describe('paper sizes', () => {
	it('has the standard sheet sizes', () => {
		// ISO 216: A4 210 × 297 mm, A3 297 × 420 mm.
		expect(PAPER.a4).toMatchObject({ widthMm: 210, heightMm: 297 });
		expect(PAPER.a3).toMatchObject({ widthMm: 297, heightMm: 420 });
		// ANSI/ASME Y14.1: Letter 8.5 × 11 in = 215.9 × 279.4 mm; Tabloid (B) 11 × 17 in = 279.4 × 431.8 mm.
		expect(PAPER.letter.widthMm).toBeCloseTo(215.9, 9);
		expect(PAPER.letter.heightMm).toBeCloseTo(279.4, 9);
		expect(PAPER.tabloid.widthMm).toBeCloseTo(279.4, 9);
		expect(PAPER.tabloid.heightMm).toBeCloseTo(431.8, 9);
	});

	it('converts mm and pt at 72 pt per 25.4 mm', () => {
		// ISO 32000-1 §8.3.2.3: one user space unit is 1/72 inch; 1 in = 25.4 mm exactly.
		expect(mmToPt(25.4)).toBeCloseTo(72, 12);
		expect(ptToMm(72)).toBeCloseTo(25.4, 12);
		expect(mmToPt(210)).toBeCloseTo(595.2756, 4);
	});

	it('normalises custom sizes to portrait', () => {
		expect(paperSize({ widthMm: 300, heightMm: 200 })).toMatchObject({ widthMm: 200, heightMm: 300 });
		expect(() => paperSize({ widthMm: 0, heightMm: 10 })).toThrow();
	});

	it('makes pages whose size poppler reads as the standard size within 0.01 pt', async () => {
		const doc = await PDFDocument.create();
		for (const name of ['a4', 'a3', 'letter', 'tabloid'] as const) {
			const p = PAPER[name];
			doc.addPage([mmToPt(p.widthMm), mmToPt(p.heightMm)]);
		}
		const bytes = await doc.save();
		qpdfCheck(bytes);
		const { boxes } = pdfinfoBoxes(bytes);
		// Expected pt values: ISO 216 A4 210 × 297 mm = 595.276 × 841.890 pt; A3 297 × 420 mm = 841.890 × 1190.551 pt;
		// ANSI/ASME Y14.1 Letter 8.5 × 11 in = 612 × 792 pt; Tabloid 11 × 17 in = 792 × 1224 pt.
		const expected = [
			[595.276, 841.89],
			[841.89, 1190.551],
			[612, 792],
			[792, 1224]
		];
		boxes.forEach((b, i) => {
			// pdfinfo -box (poppler) MediaBox, which is what a printer or RIP reads.
			expect(Math.abs(b.media.x1 - b.media.x0 - expected[i][0])).toBeLessThan(0.01);
			expect(Math.abs(b.media.y1 - b.media.y0 - expected[i][1])).toBeLessThan(0.01);
		});
	});
});
