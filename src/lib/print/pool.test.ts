import { beforeAll, afterAll, describe, expect, it } from 'vitest';
import { demoGameWithArt } from '../demo/demo-art';
import type { Game } from '../game/model';
import { zipPngParts } from './png-job';
import type { GamePdfOptions } from './sheet-job';
import { PrintOptionsError } from './options';
import { PrintBusyError, PrintPool, defaultPoolSize } from './pool';
import { pdfinfoBoxes, qpdfCheck } from './testing/poppler';

let demo: { game: Game; art: Map<string, Uint8Array> };
let pool: PrintPool;
beforeAll(async () => {
	demo = await demoGameWithArt();
	pool = new PrintPool({ size: 2, maxQueue: 2 });
});
afterAll(() => pool.close());

const OPTIONS: Omit<GamePdfOptions, 'onProgress' | 'cache'> = {
	paper: 'a4',
	layout: 'spaced',
	duplex: 'long',
	marks: true,
	sets: 1,
	colour: 'rgb',
	kinds: ['kd-hazard', 'kd-wager'],
	date: '2026-01-01'
};

describe('PrintPool', () => {
	it('builds a sheet PDF in a worker thread: valid for qpdf, pages as pdfinfo counts them, progress on the way', async () => {
		const progress: [number, number][] = [];
		const r = await pool.run({ type: 'sheets', game: demo.game, art: demo.art, options: OPTIONS }, { onProgress: (d, t) => progress.push([d, t]) });
		qpdfCheck(r.bytes);
		// 8 hazard cards on 1 sheet, 60 wager cards on 8 (see job.test.ts), duplex, plus the cutting guide.
		expect(r.sheets).toBe(9);
		expect(pdfinfoBoxes(r.bytes).pages).toBe(9 * 2 + 1);
		expect(progress.length).toBeGreaterThan(0);
		const [done, total] = progress.at(-1)!;
		expect(done).toBe(total);
		// The bytes came over whole (transferred, not a view into a shared buffer).
		expect(r.bytes.byteOffset).toBe(0);
		expect(r.jobCache.layout.misses).toBeGreaterThan(0);

		// The same game again goes to the same worker, whose cache has every face.
		expect(r.workerId).toBeGreaterThan(0);
		const again = await pool.run({ type: 'sheets', game: demo.game, art: demo.art, options: OPTIONS });
		expect(again.workerId).toBe(r.workerId);
		expect(again.jobCache.layout.misses).toBe(0);
		expect(again.jobCache.pixels.misses).toBe(0);
	});

	it('builds a press PDF and a PNG zip', async () => {
		const card = demo.game.cards.find((c) => c.kindId === 'kd-hazard')!;
		const press = await pool.run({ type: 'press', game: demo.game, art: demo.art, cardId: card.id, options: {} });
		qpdfCheck(press.bytes);
		expect(pdfinfoBoxes(press.bytes).pages).toBe(2);
		const zip = await pool.run({ type: 'pngs', game: demo.game, art: demo.art, options: { kinds: ['kd-hazard'] } });
		expect(zip.files).toBe(5);
		// A zip file starts with a local file header, PK\3\4 (APPNOTE.TXT §4.3.7).
		expect([...zip.bytes.subarray(0, 4)]).toEqual([0x50, 0x4b, 3, 4]);

		// The same zip drawn in two shares on both workers at once: the same bytes.
		const parts = await Promise.all(
			[0, 1].map((index) =>
				pool.run(
					{ type: 'png-part', game: demo.game, art: demo.art, options: { kinds: ['kd-hazard'], shard: { index, count: 2 } } },
					{ affinity: `png-${index}` }
				)
			)
		);
		expect(parts.map((p) => p.part!.files.filter(([f]) => f.endsWith('.png')).length)).toEqual([3, 2]);
		const joined = zipPngParts(parts.map((p) => p.part!));
		expect(joined.files).toBe(5);
		expect(Buffer.from(joined.zip).equals(Buffer.from(zip.bytes))).toBe(true);
	});

	it('gives each worker the cache budget asked for', async () => {
		const small = new PrintPool({ size: 1, cacheBytes: 4 << 20 });
		try {
			await small.run({ type: 'press', game: demo.game, art: demo.art, cardId: demo.game.cards[0].id, options: {} });
			const stats = await small.cacheStats();
			expect(stats.maxBytes).toBe(4 << 20);
			expect(stats.bytes).toBeLessThanOrEqual(4 << 20);
			expect(stats.layout.entries).toBe(2);
		} finally {
			await small.close();
		}
	});

	it('isolated builds give the same bytes whatever the worker built before', async () => {
		const one = new PrintPool({ size: 1 });
		try {
			const hazards = { type: 'sheets' as const, isolated: true, game: demo.game, art: demo.art, options: { ...OPTIONS, kinds: ['kd-hazard'] } };
			const press = { type: 'press' as const, isolated: true, game: demo.game, art: demo.art, cardId: demo.game.cards[0].id, options: { date: '2026-01-01' } };
			const first = [await one.run(hazards), await one.run(press)];
			// In between, a build with other texts (the wager cards' fi ligature) and other faces in the worker's cache.
			await one.run({ type: 'sheets', game: demo.game, art: demo.art, options: OPTIONS });
			await new Promise((r) => setTimeout(r, 1100));
			const again = [await one.run(hazards), await one.run(press)];
			expect(Buffer.from(again[0].bytes).equals(Buffer.from(first[0].bytes))).toBe(true);
			expect(Buffer.from(again[1].bytes).equals(Buffer.from(first[1].bytes))).toBe(true);
		} finally {
			await one.close();
		}
	});

	it('replaces a worker that drew PNGs once quiet, with a warm one; a worker that built only sheets keeps its cache', async () => {
		const one = new PrintPool({ size: 1, idleMs: 300 });
		const quiet = () => new Promise((r) => setTimeout(r, 2000));
		try {
			const sheets = await one.run({ type: 'sheets', game: demo.game, art: demo.art, options: { ...OPTIONS, kinds: ['kd-hazard'] } });
			await quiet();
			let stats = await one.cacheStats();
			expect(stats.layout.entries).toBeGreaterThan(0);
			const zip = await one.run({ type: 'pngs', game: demo.game, art: demo.art, options: { kinds: ['kd-hazard'] } });
			expect(zip.workerId).toBe(sheets.workerId);
			expect(zip.cache.png.entries).toBeGreaterThan(0);
			await quiet();
			stats = await one.cacheStats();
			expect(stats.png.entries + stats.layout.entries).toBe(0);
			expect(one.threads).toBe(1);
			// The new worker builds as the old one did.
			const again = await one.run({ type: 'sheets', game: demo.game, art: demo.art, options: { ...OPTIONS, kinds: ['kd-hazard'] } });
			expect(again.workerId).not.toBe(sheets.workerId);
			expect(Buffer.from(again.bytes).equals(Buffer.from(sheets.bytes))).toBe(true);
		} finally {
			await one.close();
		}
	});

	it('sends refusals back as PrintOptionsError with their status', async () => {
		const err = await pool.run({ type: 'sheets', game: demo.game, art: demo.art, options: { ...OPTIONS, kinds: ['kd-missing'] } }).catch((e) => e);
		expect(err).toBeInstanceOf(PrintOptionsError);
		expect(err.status).toBe(400);
		expect(err.message).toMatch(/no card kind “kd-missing”/);
	});

	it('starts every worker warm: fonts and wasm are loaded before the first job', async () => {
		const fresh = new PrintPool({ size: 2 });
		try {
			await fresh.ready();
			const stats = await fresh.cacheStats();
			expect(stats.layout.entries).toBe(0);
		} finally {
			await fresh.close();
		}
	});

	it('runs at most `size` builds at once and queues the rest; a full queue refuses', async () => {
		const job = { type: 'sheets' as const, game: demo.game, art: demo.art, options: { ...OPTIONS, kinds: ['kd-hazard'] } };
		const runs = [pool.run(job, { affinity: 'a' }), pool.run(job, { affinity: 'b' }), pool.run(job, { affinity: 'c' }), pool.run(job, { affinity: 'd' })];
		expect(pool.running).toBe(2);
		expect(pool.waiting).toBe(2);
		await expect(pool.run(job)).rejects.toBeInstanceOf(PrintBusyError);
		const results = await Promise.all(runs);
		for (const r of results) qpdfCheck(r.bytes);
		expect(new Set(results.map((r) => r.workerId)).size).toBe(2);
		expect(pool.running + pool.waiting).toBe(0);
	});
});

describe('defaultPoolSize', () => {
	it('is one worker per core but one (at least one) unless a count is chosen', () => {
		expect(defaultPoolSize(undefined, 1)).toBe(1);
		expect(defaultPoolSize(undefined, 2)).toBe(1);
		expect(defaultPoolSize(undefined, 8)).toBe(7);
		expect(defaultPoolSize('3', 2)).toBe(3);
		// Not a count: the default stands.
		for (const bad of ['0', '-2', '1.5', 'many', '']) expect(defaultPoolSize(bad, 4)).toBe(3);
	});
});
