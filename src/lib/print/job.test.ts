import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { unzipSync, strFromU8 } from 'fflate';
import { fileSlug } from './file-names';
import { imageSize } from 'image-size';
import { beforeAll, describe, expect, it } from 'vitest';
import { demoGameWithArt } from '../demo/demo-art';
import { cardSize, type Game } from '../game/model';
import { PrintCache } from './cache';
import type { TextItem } from './display-list';
import { buildCardPressPdf } from './press-job';
import { buildCardsPngZip } from './png-job';
import { buildGamePdf, type GamePdfOptions } from './sheet-job';
import { loadGameImages, renderGameFaces } from './job';
import { parsePrintOptions, PrintOptionsError, PrintOptionsSchema } from './options';
import { pdfinfoBoxes, pdftotext, qpdfCheck, qpdfJson, rasterGrey } from './testing/poppler';

let demo: { game: Game; art: Map<string, Uint8Array> };
beforeAll(async () => {
	demo = await demoGameWithArt();
});

const BASE: GamePdfOptions = { paper: 'a4', layout: 'spaced', duplex: 'long', marks: true, sets: 1, colour: 'rgb', date: '2026-01-01' };

/** Words with their boxes in pt on one page, from poppler's `pdftotext -bbox`. */
function* wordBoxes(pdf: Uint8Array, page: number) {
	const dir = mkdtempSync(join(tmpdir(), 'paddock-words-'));
	try {
		writeFileSync(join(dir, 'in.pdf'), pdf);
		const html = execFileSync('pdftotext', ['-bbox', '-f', String(page), '-l', String(page), join(dir, 'in.pdf'), '-'], { encoding: 'utf8' });
		for (const m of html.matchAll(/<word xMin="([\d.]+)" yMin="[\d.]+" xMax="([\d.]+)" yMax="[\d.]+">([^<]*)<\/word>/g))
			yield { xMin: Number(m[1]), xMax: Number(m[2]), text: m[3].replace(/&amp;/g, '&') };
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

/** pdfinfo's page count (poppler, an independent reader). */
const pageCount = (pdf: Uint8Array) => pdfinfoBoxes(pdf).pages;

describe('buildGamePdf on the demo game', () => {
	it('passes qpdf --check; pages = sheets × 2 (duplex) + the cutting guide', async () => {
		const out = await buildGamePdf(demo.game, demo.art, { ...BASE, cache: new PrintCache(), versionLabel: 'proof 3' });
		qpdfCheck(out.pdf);
		/*
		 * Sheets by hand, A4 landscape (ISO 216: 297 × 210 mm), 5 mm margin, 3 mm bleed, 2 mm gutter:
		 * printable 287 × 200 mm.
		 * - poker 69.5 × 94.9 with bleed: 4 across (4·69.5 + 3·2 = 284), 2 down (2·94.9 + 2 = 191.8) = 8;
		 *   42 snail + 3 beetle + 7 setup + 16 aid cards = 68 → 9 sheets.
		 * - bridge 63.15 × 94.9: 4 × 2 = 8 (portrait gives only 3 × 2); 60 wager cards → 8 sheets.
		 * - mini 50 × 74: 5 × 2 = 10; 8 hazard cards → 1 sheet.
		 * - tarot turned 126 × 76: 2 × 2 = 4; 8 tiles → 2 sheets.
		 */
		expect(out.sheets).toBe(9 + 8 + 1 + 2);
		expect(pageCount(out.pdf)).toBe(out.sheets * 2 + 1);
		expect(out.pages).toBe(out.sheets * 2 + 1);
		const text = pdftotext(out.pdf);
		expect(text).toContain('The Marrowbed Derby · proof 3');
		expect(text).toMatch(/Cutting guide/);
		// Pebble's portrait and the hazard back are delivered at low resolution on purpose.
		expect(out.warnings.some((w) => /snail-pebble\.png” prints at \d+ dpi/.test(w))).toBe(true);
	});

	it('without duplex: one page per sheet; without the guide: no extra page; fold: backs beside fronts', async () => {
		const cache = new PrintCache();
		const simplex = await buildGamePdf(demo.game, demo.art, { ...BASE, duplex: 'none', cuttingGuide: false, cache });
		expect(pageCount(simplex.pdf)).toBe(simplex.sheets);
		expect(simplex.warnings.some((w) => /not printed without duplex/.test(w))).toBe(true);
		const fold = await buildGamePdf(demo.game, demo.art, { ...BASE, layout: 'fold', duplex: 'none', kinds: ['kd-hazard'], cache });
		qpdfCheck(fold.pdf);
		expect(pageCount(fold.pdf)).toBe(fold.sheets + 1);
	});

	it('prints sets: two sets of the 8 hazard cards need 2 sheets of 10', async () => {
		const out = await buildGamePdf(demo.game, demo.art, { ...BASE, kinds: ['kd-hazard'], sets: 2, duplex: 'short', cache: new PrintCache() });
		expect(out.sheets).toBe(2);
		expect(pageCount(out.pdf)).toBe(2 * 2 + 1);
	});

	it('draws each distinct face once (form XObjects, ISO 32000-1 §8.10) and each image once', async () => {
		const cache = new PrintCache();
		const faces = await renderGameFaces(demo.game, demo.art, { cache });
		const distinct = new Set(faces.cards.flatMap((c) => [c.front, c.back]));
		const out = await buildGamePdf(demo.game, demo.art, { ...BASE, cache });
		const objects = Object.values(qpdfJson(out.pdf).qpdf[1] as Record<string, any>);
		const forms = objects.filter((o) => o?.stream?.dict?.['/Subtype'] === '/Form');
		// Face forms are the size of a face; the others (crop marks) the size of a sheet.
		const isFace = (o: any) => Math.max(...o.stream.dict['/BBox']) < 400;
		expect(forms.filter(isFace).length).toBe(distinct.size);
		// Crop marks: one form per sheet layout, not one per page (4 sizes, each with its one grid here).
		expect(forms.filter((o) => !isFace(o)).length).toBeLessThanOrEqual(2 * 4);
		const images = objects.filter((o) => o?.stream?.dict?.['/Subtype'] === '/Image' && !o.stream.dict['/SMask'] && o.stream.dict['/ColorSpace'] !== '/DeviceGray');
		expect(images.length).toBeLessThanOrEqual(new Set(demo.game.art.map((a) => a.sha256)).size);
	});

	it('a rebuild from the cache reads and renders the same as a cold build (pdftotext, pdftoppm)', async () => {
		const cache = new PrintCache();
		const options = { ...BASE, kinds: ['kd-wager', 'kd-tile'], cache };
		const cold = await buildGamePdf(demo.game, demo.art, options);
		const warm = await buildGamePdf(demo.game, demo.art, options);
		expect(cache.stats().layout.hits).toBeGreaterThan(0);
		qpdfCheck(warm.pdf);
		expect(pdftotext(warm.pdf)).toBe(pdftotext(cold.pdf));
		for (const page of [1, 2, warm.pages - 1]) {
			const a = rasterGrey(cold.pdf, page, 30);
			const b = rasterGrey(warm.pdf, page, 30);
			expect(b.data.length).toBe(a.data.length);
			let differing = 0;
			for (let i = 0; i < a.data.length; i++) if (Math.abs(a.data[i] - b.data[i]) > 2) differing++;
			expect(differing, `page ${page}`).toBe(0);
		}
	});

	it('prints ligatures at their own width: a line is as wide in the PDF as the layout measured it (pdftotext -bbox)', async () => {
		const cache = new PrintCache();
		const faces = await renderGameFaces(demo.game, demo.art, { kinds: ['kd-wager'], cache });
		const line = faces.cards
			.flatMap((c) => c.front.items)
			.find((i): i is TextItem => i.type === 'text' && i.text.includes('first'))!;
		expect(line).toBeDefined();
		const { pdf } = await buildGamePdf(demo.game, demo.art, { ...BASE, kinds: ['kd-wager'], duplex: 'none', cache });
		// poppler places each word by the widths the PDF gives its glyphs (ISO 32000-1 §9.7.4.3 /W).
		const words = [...wordBoxes(pdf, 1)];
		const first = line.text.split(' ');
		const at = words.findIndex((w, i) => first.every((t, j) => words[i + j]?.text === t));
		expect(at).toBeGreaterThanOrEqual(0);
		const widthPt = words[at + first.length - 1].xMax - words[at].xMin;
		expect(widthPt / (72 / 25.4)).toBeCloseTo(line.widthMm, 1);
	});

	it('refuses a card larger than the printable area with a PrintOptionsError (400) that names it', async () => {
		const game = structuredClone(demo.game);
		const tarot = game.kinds.find((k) => k.id === 'kd-tile')!;
		tarot.size = { preset: 'custom', widthMm: 200, heightMm: 290 };
		const err = await buildGamePdf(game, demo.art, { ...BASE, marginMm: 10, kinds: ['kd-tile'], cache: new PrintCache() }).catch((e) => e);
		expect(err).toBeInstanceOf(PrintOptionsError);
		expect(err.status).toBe(400);
		// 200 × 290 + 3 mm bleed each side = 206 × 296 mm; A4 less 10 mm margins is 190 × 277 (ISO 216).
		expect(err.message).toBe('Track tiles (206 × 296 mm with bleed) do not fit inside A4’s printable area with a 10 mm margin');
	});

	it('refuses other impossible requests', async () => {
		const cache = new PrintCache();
		await expect(buildGamePdf(demo.game, demo.art, { ...BASE, sets: 0, cache })).rejects.toThrow(PrintOptionsError);
		await expect(buildGamePdf(demo.game, demo.art, { ...BASE, kinds: ['kd-nope'], cache })).rejects.toThrow(/no card kind “kd-nope”/);
		await expect(buildGamePdf(demo.game, demo.art, { ...BASE, backOffsetMm: { x: 30, y: 0 }, cache })).rejects.toThrow(/back offset/);
		const empty = structuredClone(demo.game);
		for (const c of empty.cards) c.copies = 0;
		await expect(buildGamePdf(empty, demo.art, { ...BASE, cache })).rejects.toThrow(/Nothing to print/);
	});
});

describe('loadGameImages', () => {
	const artAsset = (sha256: string, mime: 'image/png' | 'image/svg+xml', fileName: string) => ({
		id: `art-${fileName}`,
		sha256,
		mime,
		widthPx: 10,
		heightPx: 10,
		status: 'final' as const,
		fileName,
		assignment: { scope: 'runner' as const, targetId: 'rn-rosehip', slot: 'portrait' }
	});

	it('rasterises SVG art at 300 dpi over the largest face, reads PNG sizes from the file, and refuses what it cannot print', async () => {
		const svg = new TextEncoder().encode(
			'<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 100 50" width="100" height="50"><rect width="100" height="50" fill="#c8363d"/></svg>'
		);
		// A PNG signature and IHDR (ISO/IEC 15948 §11.2.2) claiming 20000 × 20000 px: refused from the header alone.
		const huge = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0x4e, 0x20, 0, 0, 0x4e, 0x20, 8, 6, 0, 0, 0, 0, 0, 0, 0]);
		const realPng = demo.art.values().next().value!;
		const game = structuredClone(demo.game);
		const [a, b, c, d] = ['a', 'b', 'c', 'd'].map((x) => x.repeat(64));
		game.art = [artAsset(a, 'image/svg+xml', 'vector.svg'), artAsset(b, 'image/png', 'huge.png'), artAsset(c, 'image/png', 'missing.png'), artAsset(d, 'image/png', 'real.png')];
		const art = new Map([[a, svg], [b, huge], [d, realPng]]);
		const { images, warnings } = await loadGameImages(game, art, new PrintCache());
		// The largest demo face is a turned tarot tile with bleed: 126 mm; at 300 px per 25.4 mm = 1488.2 → 1488 px.
		expect(images.get(a)).toMatchObject({ mime: 'image/png', widthPx: 1488, heightPx: 744 });
		expect(imageSize(images.get(a)!.bytes)).toMatchObject({ type: 'png', width: 1488 });
		// The record said 10 × 10; the file's own header (read by image-size) wins.
		const header = imageSize(realPng);
		expect(images.get(d)).toMatchObject({ mime: 'image/png', widthPx: header.width, heightPx: header.height });
		expect(images.has(b)).toBe(false);
		expect(images.has(c)).toBe(false);
		expect(warnings.join('\n')).toMatch(/huge\.png” cannot be printed: 20000 × 20000 px is more than 100 megapixels/);
		expect(warnings.join('\n')).toMatch(/missing\.png” has no file/);
	});
});

describe('PrintOptionsSchema', () => {
	it('parses query strings into options, with defaults', () => {
		expect(parsePrintOptions(new URLSearchParams('paper=Letter&layout=butted&duplex=short&marks=no&sets=3&margin=6.5&colour=cmyk'))).toMatchObject({
			paper: 'letter',
			layout: 'butted',
			duplex: 'short',
			marks: false,
			sets: 3,
			marginMm: 6.5,
			colour: 'cmyk',
			cuttingGuide: true
		});
		expect(PrintOptionsSchema.parse({ paper: 'custom:300x450', kinds: 'kd-a, kd-b', backX: '1.5' })).toMatchObject({
			paper: { widthMm: 300, heightMm: 450 },
			kinds: ['kd-a', 'kd-b'],
			backOffsetMm: { x: 1.5, y: 0 },
			layout: 'spaced',
			duplex: 'none',
			marks: true,
			sets: 1
		});
	});

	it('gives every reason for bad parameters', () => {
		const bad = () => parsePrintOptions({ paper: 'b5', sets: '51', marks: 'maybe', layout: 'tiled' });
		expect(bad).toThrow(PrintOptionsError);
		expect(bad).toThrow(/Unknown paper “b5”/);
		expect(bad).toThrow(/sets is 1 to 50/);
		expect(bad).toThrow(/“maybe” is not yes or no/);
		expect(bad).toThrow(/layout is spaced, butted or fold/);
		expect(() => parsePrintOptions({ paper: 'custom:10x10' })).toThrow(/50–1500 mm/);
	});
});

describe('per-card files', () => {
	it('press PDF: front and back pages, MediaBox ⊇ BleedBox ⊇ TrimBox (ISO 32000-1 §14.11.2)', async () => {
		const card = demo.game.cards.find((c) => c.kindId === 'kd-wager')!;
		const { pdf } = await buildCardPressPdf(demo.game, demo.art, card.id, { cache: new PrintCache() });
		qpdfCheck(pdf);
		const { pages, boxes } = pdfinfoBoxes(pdf);
		expect(pages).toBe(2);
		const k = 72 / 25.4; // pt per mm (ISO 32000-1 §8.3.2.3: 1/72 in)
		const bridge = cardSize('bridge');
		for (const b of boxes) {
			expect((b.trim.x1 - b.trim.x0) / k).toBeCloseTo(bridge.widthMm, 1);
			expect((b.bleed.x1 - b.bleed.x0) / k).toBeCloseTo(bridge.widthMm + 6, 1);
			expect(b.trim.x0).toBeGreaterThanOrEqual(b.bleed.x0);
			expect(b.bleed.x0).toBeGreaterThanOrEqual(b.media.x0);
		}
		await expect(buildCardPressPdf(demo.game, demo.art, 'no-such-card')).rejects.toMatchObject({ status: 404 });
	});

	it('PNG zip: one file per face at 300 dpi with bleed, a list of cards and the print-shop note', async () => {
		const { zip, files } = await buildCardsPngZip(demo.game, demo.art, { kinds: ['kd-hazard'], cache: new PrintCache() });
		const entries = unzipSync(zip);
		const pngs = Object.keys(entries).filter((n) => n.endsWith('.png'));
		// 4 hazard cards and their one shared back.
		expect(files).toBe(5);
		expect(pngs.length).toBe(5);
		expect(pngs).toContain('garden-hazards/back.png');
		// Files are named after the cards, never their ids.
		const hazardCards = demo.game.cards.filter((c) => c.kindId === 'kd-hazard');
		for (const c of hazardCards) expect(pngs).toContain(`garden-hazards/${fileSlug(c.name)}-front.png`);
		for (const name of pngs) expect(name).not.toContain('kd-hazard');
		// mini 44 × 68 mm + 3 mm bleed each side = 50 × 74 mm; at 300 px per 25.4 mm: 590.6 → 591 px across.
		for (const name of pngs) {
			const size = imageSize(entries[name]);
			expect(size).toMatchObject({ type: 'png', width: 591 });
			// Down the face the file resolves 300 dpi to within a pixel (74 mm = 874.0 px).
			expect(Math.abs(size.height - 874)).toBeLessThanOrEqual(1);
		}
		const csv = strFromU8(entries['cards.csv']).trim().split(/\r?\n/);
		expect(csv[0]).toBe('kind,card,id,copies,front,back,widthMm,heightMm,bleedMm');
		expect(csv.length).toBe(1 + 4);
		expect(strFromU8(entries['about.txt'])).toMatch(/confirm sizes, bleed and file requirements/);
	});
});
