/**
 * The print cache on disk: a sheet PDF built from kept faces, forms, pixels and font records
 * prints the same as one built from nothing, read by independent tools (poppler's pdfinfo,
 * pdftotext and pdftoppm, qpdf) and compared pixel by pixel with pixelmatch. A changed card is
 * drawn again alone; a damaged entry is ignored and made again.
 *
 * Each build after the first stands for a new process: a fresh in-memory cache (so the laid-out
 * faces are new objects, with no forms kept for them) and fonts forgotten.
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync, truncateSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pixelmatch from 'pixelmatch';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoGameWithArt } from '../demo/demo-art';
import type { Game } from '../game/model';
import { PrintCache } from './cache';
import { PrintDiskCache } from './disk-cache';
import { forgetSharedFonts } from './pdf-fontkit';
import { buildGamePdf, type GamePdfOptions } from './sheet-job';
import { pdfinfoBoxes, pdftotext, qpdfCheck, rasterAllGrey } from './testing/poppler';

let demo: { game: Game; art: Map<string, Uint8Array> };
const dirs: string[] = [];
beforeAll(async () => {
	demo = await demoGameWithArt();
}, 120_000);
afterAll(() => {
	for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

const OPTIONS: GamePdfOptions = { paper: 'a4', layout: 'spaced', duplex: 'long', marks: true, sets: 1, colour: 'rgb', date: '2026-01-01' };

function tempDir(): string {
	const d = mkdtempSync(join(tmpdir(), 'paddock-disk-cache-'));
	dirs.push(d);
	return d;
}

/** A build as a new process would do it: nothing in memory, the disk cache at `dir` (if any). */
async function build(game: Game, dir?: string, options: Partial<GamePdfOptions> = {}) {
	forgetSharedFonts();
	const disk = dir ? new PrintDiskCache(dir) : undefined;
	const r = await buildGamePdf(game, demo.art, { ...OPTIONS, ...options, cache: new PrintCache(), disk });
	return { pdf: r.pdf, disk };
}

/** Page count, boxes, text and pixels (50 dpi grey) the same, as independent readers see them. */
function expectSamePrint(a: Uint8Array, b: Uint8Array) {
	qpdfCheck(b);
	const [boxesA, boxesB] = [pdfinfoBoxes(a), pdfinfoBoxes(b)];
	expect(boxesB.pages).toBe(boxesA.pages);
	expect(boxesB.boxes).toEqual(boxesA.boxes);
	expect(pdftotext(b)).toBe(pdftotext(a));
	const [pagesA, pagesB] = [rasterAllGrey(a, 50), rasterAllGrey(b, 50)];
	expect(pagesB.length).toBe(pagesA.length);
	for (let i = 0; i < pagesA.length; i++) {
		const [pa, pb] = [pagesA[i], pagesB[i]];
		expect([pb.width, pb.height]).toEqual([pa.width, pa.height]);
		const rgba = (g: Uint8Array) => {
			const out = new Uint8Array(g.length * 4);
			for (let p = 0; p < g.length; p++) out.set([g[p], g[p], g[p], 255], p * 4);
			return out;
		};
		// pixelmatch's default colour threshold; at most a handful of pixels may differ (anti-aliasing).
		const differing = pixelmatch(rgba(pa.data), rgba(pb.data), null, pa.width, pa.height);
		expect(differing, `page ${i + 1}`).toBeLessThanOrEqual(pa.width * pa.height * 0.0005);
	}
}

/** Two kinds of the demo (a shared back, pictures): enough for the cases below at a third of the pages. */
const SOME: Partial<GamePdfOptions> = { kinds: ['kd-movement', 'kd-hazard'] };

const files = (dir: string, area: string) => readdirSync(dir).filter((f) => f.startsWith(`${area}-`));

describe('the print cache on disk', () => {
	it('a repeat build assembles the same sheets from kept faces, forms, pixels and fonts', async () => {
		const dir = tempDir();
		const plain = await build(demo.game);
		const cold = await build(demo.game, dir);
		expect(cold.disk!.stats.written.layout).toBeGreaterThan(0);
		expect(cold.disk!.stats.written.form).toBe(cold.disk!.stats.written.layout);
		expect(cold.disk!.stats.written.pixels).toBeGreaterThan(0);
		expect(cold.disk!.stats.written.font).toBe(2);
		const warm = await build(demo.game, dir);
		// Everything came from disk: nothing was laid out, drawn, decoded or shaped anew.
		expect(warm.disk!.stats.written).toEqual({ layout: 0, form: 0, pixels: 0, font: 0 });
		expect(warm.disk!.stats.damaged).toBe(0);
		expectSamePrint(plain.pdf, warm.pdf);
	}, 300_000);

	it('a changed card is laid out and drawn again alone', async () => {
		const dir = tempDir();
		await build(demo.game, dir, SOME);
		const game = structuredClone(demo.game);
		const card = game.cards.find((c) => c.data.type === 'movement')!;
		card.name = `${card.name} (revised)`;
		const changed = await build(game, dir, SOME);
		// Its front only: movement cards share one back.
		expect(changed.disk!.stats.written.layout).toBe(1);
		expect(changed.disk!.stats.written.form).toBe(1);
		expect(changed.disk!.stats.written.pixels).toBe(0);
		expectSamePrint((await build(game, undefined, SOME)).pdf, changed.pdf);
	}, 300_000);

	it('a truncated or damaged entry is ignored and made again, never a broken PDF', async () => {
		const dir = tempDir();
		const plain = await build(demo.game, undefined, SOME);
		await build(demo.game, dir, SOME);
		const [form] = files(dir, 'form');
		const [layout] = files(dir, 'layout');
		const [pixels] = files(dir, 'pixels');
		const [font] = files(dir, 'font');
		truncateSync(join(dir, form), Math.floor(statSync(join(dir, form)).size / 2));
		const garbled = readFileSync(join(dir, layout));
		garbled[garbled.length - 3] ^= 0xff;
		writeFileSync(join(dir, layout), garbled);
		writeFileSync(join(dir, pixels), new Uint8Array(0));
		writeFileSync(join(dir, font), 'not a font record');
		const repaired = await build(demo.game, dir, SOME);
		expect(repaired.disk!.stats.damaged).toBe(4);
		expect(repaired.disk!.stats.written.form).toBeGreaterThanOrEqual(1);
		expect(repaired.disk!.stats.written.layout).toBeGreaterThanOrEqual(1);
		expect(repaired.disk!.stats.written.pixels).toBe(1);
		expectSamePrint(plain.pdf, repaired.pdf);
		// And the next build finds everything whole again.
		const again = await build(demo.game, dir, SOME);
		expect(again.disk!.stats.damaged).toBe(0);
		expect(again.disk!.stats.written).toEqual({ layout: 0, form: 0, pixels: 0, font: 0 });
	}, 300_000);

	it('stays under its byte bound by removing the least recently used entries', () => {
		const dir = tempDir();
		const disk = new PrintDiskCache(dir, 2500);
		// Five entries of 1 kB, written a minute ago one second apart (k0 oldest).
		for (let i = 0; i < 5; i++) {
			const before = new Set(readdirSync(dir));
			disk.write('layout', `k${i}`, new Uint8Array(1000));
			const file = readdirSync(dir).find((f) => !before.has(f))!;
			const when = new Date(Date.now() - 60_000 + i * 1000);
			utimesSync(join(dir, file), when, when);
		}
		// Reading k0 makes it the most recently used.
		expect(disk.read('layout', 'k0')).toBeDefined();
		const left = disk.trim();
		expect(left.bytes).toBeLessThanOrEqual(2500);
		expect(left.entries).toBe(2);
		expect(disk.read('layout', 'k0')).toBeDefined();
		expect(disk.read('layout', 'k4')).toBeDefined();
		for (const gone of ['k1', 'k2', 'k3']) expect(disk.read('layout', gone)).toBeUndefined();
	});
});
