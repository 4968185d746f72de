/**
 * The same sheets as HTML, for chromium to print: one absolutely positioned <img> per card at
 * the slot Paddock's plan gives it (mm), backs mirrored as in the PDF, one CSS page per sheet
 * side, each distinct face pre-rendered as a 300 dpi PNG. No crop marks.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Game } from '../../src/lib/game/model';
import { PrintCache } from '../../src/lib/print/cache';
import type { FaceLayout } from '../../src/lib/print/display-list';
import { cachedFacePng, renderGameFaces } from '../../src/lib/print/job';
import type { GamePdfOptions } from '../../src/lib/print/sheet-job';
import { paperSize } from '../../src/lib/print/paper';
import { planSheets, type SheetOptions } from '../../src/lib/print/sheet-plan';

export interface ChromiumSheets {
	htmlPath: string;
	/** Distinct faces written as PNGs, and how long that took (ms). */
	faces: number;
	prerenderMs: number;
	pages: number;
}

export async function writeChromiumSheets(game: Game, art: Map<string, Uint8Array>, job: GamePdfOptions, dir: string): Promise<ChromiumSheets> {
	const cache = new PrintCache();
	const faces = await renderGameFaces(game, art, { cache });
	const keys = new Map<FaceLayout, string>();
	for (const c of faces.cards) {
		keys.set(c.front, c.frontKey);
		if (c.back && c.backKey) keys.set(c.back, c.backKey);
	}
	const files = new Map<FaceLayout, string>();
	const t = performance.now();
	for (const [face, key] of keys) {
		const name = `f${files.size}.png`;
		writeFileSync(join(dir, name), await cachedFacePng(face, key, faces.images, 300, cache));
		files.set(face, name);
	}
	const prerenderMs = performance.now() - t;
	const options: SheetOptions = { ...job, marginMm: 5, cuttingGuide: false, backOffsetMm: undefined, sets: 1, marks: true, duplex: job.duplex };
	const plan = planSheets({ faces: faces.cards, options });
	const sheet = paperSize(job.paper);
	const pages: string[] = [];
	for (const g of plan.groups) {
		const landscape = g.imposition.orientation === 'landscape';
		for (const p of g.pages) {
			const imgs = p.cards
				.map((c) => {
					const b = c.slot.bleedBox;
					return `<img src="${files.get(c.face)}" style="left:${b.xMm}mm;top:${b.yMm}mm;width:${b.widthMm}mm;height:${b.heightMm}mm">`;
				})
				.join('');
			pages.push(`<section class="${landscape ? 'land' : 'port'}">${imgs}</section>`);
		}
	}
	const [w, h] = [sheet.widthMm, sheet.heightMm];
	const html = `<!doctype html><html><head><meta charset="utf-8"><style>
@page port { size: ${w}mm ${h}mm; margin: 0 }
@page land { size: ${h}mm ${w}mm; margin: 0 }
html, body { margin: 0; padding: 0 }
section { position: relative; overflow: hidden; break-after: page }
section.port { page: port; width: ${w}mm; height: ${h}mm }
section.land { page: land; width: ${h}mm; height: ${w}mm }
img { position: absolute; display: block }
</style></head><body>${pages.join('\n')}</body></html>`;
	const htmlPath = join(dir, 'sheets.html');
	writeFileSync(htmlPath, html);
	return { htmlPath, faces: files.size, prerenderMs, pages: pages.length };
}
