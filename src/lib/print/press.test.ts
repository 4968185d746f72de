import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildPressPdf, PRESS_MARK_ROOM_MM, pressMarks } from './press';
import { mmToPt } from './paper';
import { greyFor, numberedFace, POKER } from './testing/faces';
import { inkedPixelsMm, meanGreyMm, pdfinfoBoxes, qpdfCheck, qpdfJson, rasterGrey } from './testing/poppler';

// US bleed 1/8 in = 3.175 mm (common practice), so every box is a whole number of points.
const BLEED_US = 3.175;
const front = numberedFace(0, 2, 'front', POKER, BLEED_US);
const back = numberedFace(1, 2, 'back', POKER, BLEED_US);

function pdffonts(bytes: Uint8Array): string {
	const dir = mkdtempSync(join(tmpdir(), 'paddock-press-'));
	try {
		writeFileSync(join(dir, 'a.pdf'), bytes);
		return execFileSync('pdffonts', [join(dir, 'a.pdf')], { encoding: 'utf8' });
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

describe('per-card press PDF', () => {
	it('sets TrimBox and BleedBox at the card and bleed size, MediaBox = BleedBox without marks', async () => {
		const bytes = await buildPressPdf({ front, back });
		qpdfCheck(bytes); // qpdf --check
		const { pages, boxes } = pdfinfoBoxes(bytes);
		expect(pages).toBe(2); // front, then back
		for (const b of boxes) {
			// Poker 2.5 × 3.5 in = 180 × 252 pt at 72 pt/in (ISO 32000-1 §8.3.2.3), read by pdfinfo -box.
			expect(b.trim.x1 - b.trim.x0).toBeCloseTo(180, 2);
			expect(b.trim.y1 - b.trim.y0).toBeCloseTo(252, 2);
			// Plus 1/8 in = 9 pt each side: 198 × 270 pt.
			expect(b.bleed.x1 - b.bleed.x0).toBeCloseTo(198, 2);
			expect(b.bleed.y1 - b.bleed.y0).toBeCloseTo(270, 2);
			expect(b.trim.x0 - b.bleed.x0).toBeCloseTo(9, 2);
			expect(b.media).toEqual(b.bleed);
		}
	});

	it('nests MediaBox ⊇ BleedBox ⊇ TrimBox with crop marks outside the bleed (ISO 32000-1 §14.11.2, read with qpdf --json)', async () => {
		const bytes = await buildPressPdf({ front, back, cropMarks: true });
		qpdfCheck(bytes);
		const json = qpdfJson(bytes);
		const objects = json.qpdf[1] as Record<string, any>;
		for (const p of json.pages as { object: string }[]) {
			const page = objects[`obj:${p.object}`].value;
			const [media, bleed, trim] = ['/MediaBox', '/BleedBox', '/TrimBox'].map((k) => page[k] as number[]);
			const contains = (outer: number[], inner: number[]) =>
				outer[0] <= inner[0] + 1e-6 && outer[1] <= inner[1] + 1e-6 && outer[2] >= inner[2] - 1e-6 && outer[3] >= inner[3] - 1e-6;
			expect(contains(media, bleed)).toBe(true);
			expect(contains(bleed, trim)).toBe(true);
			// With marks the media is strictly larger than the bleed, by the mark room on every side.
			expect(bleed[0] - media[0]).toBeCloseTo(mmToPt(PRESS_MARK_ROOM_MM), 3);
			expect(media[2] - bleed[2]).toBeCloseTo(mmToPt(PRESS_MARK_ROOM_MM), 3);
		}
		// Marks: ink outside the bleed box only where the marks are; the face itself stays inside its bleed.
		const img = rasterGrey(bytes, 1, 300);
		const room = PRESS_MARK_ROOM_MM;
		for (const l of pressMarks(front)) {
			const x = Math.min(l.x1Mm, l.x2Mm) - 0.2;
			const y = Math.min(l.y1Mm, l.y2Mm) - 0.2;
			expect(inkedPixelsMm(img, x, y, Math.abs(l.x2Mm - l.x1Mm) + 0.4, Math.abs(l.y2Mm - l.y1Mm) + 0.4, 235)).toBeGreaterThan(5);
		}
		// A corner of the media outside the bleed, away from the marks, is blank.
		expect(inkedPixelsMm(img, 0, 0, room - 1, room - 1, 250)).toBe(0);
	});

	it('draws the front on page 1 and the back on page 2 (pixels), with the fonts embedded (pdffonts)', async () => {
		const bytes = await buildPressPdf({ front, back, colour: 'rgb' });
		const p1 = rasterGrey(bytes, 1, 100);
		const p2 = rasterGrey(bytes, 2, 100);
		expect(Math.abs(meanGreyMm(p1, 20, 60, 20, 10) - greyFor(0, 2))).toBeLessThan(4);
		expect(Math.abs(meanGreyMm(p2, 20, 60, 20, 10) - greyFor(1, 2))).toBeLessThan(4);
		// pdffonts (poppler): the emb column says yes for every font, i.e. the TrueType program is in the file.
		const rows = pdffonts(bytes).trim().split('\n').slice(2);
		expect(rows.length).toBeGreaterThan(0);
		for (const row of rows) expect(row).toMatch(/CID TrueType\s+Identity-H\s+yes/);
	});
});
