/**
 * `npm run bench`: how fast the print engine imposes a game, measured (never a timed test).
 *
 * (a) the demo game and (b) a synthetic 1,000-card game (100 distinct cards × 10 copies) through
 *     buildGamePdf: cold (empty cache), cached rebuild, and a rebuild after one card changed;
 *     each repeated (default 5): min / median / max wall time, peak memory, file size.
 * (c) file size against distinct faces and copies: 100 × 1, 100 × 10, 200 × 1.
 * (d) a build through the worker pool (cold and warm).
 * (e) the same job done without Paddock: Debian's chromium printing an HTML page that places a
 *     PNG per distinct face (rendered beforehand at 300 dpi, timed separately) at the same mm
 *     positions, through Playwright's page.pdf().
 *
 * (f) the print CLI against chromium as whole processes, alternated (./bench/cli-race.ts).
 * (g) the built server under HTTP load: memory, first sheet, faces, /me under builds, the PNG
 *     zip (./bench/server.ts; port BENCH_PORT, default 4431).
 * (h) the live preview in chromium: keystroke to new face (./bench/preview.ts; BENCH_PREVIEW_PORT).
 *
 * Writes bench-results.json. Flags: --repeats N, --no-chromium, --no-server; `--only cli` runs section (f)
 * alone and `--only server` section (g); each prints its figures (no file written).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { parseArgs } from 'node:util';
import { demoGameWithArt } from '../src/lib/demo/demo-art';
import type { BetType, Card, Game } from '../src/lib/game/model';
import { PrintCache } from '../src/lib/print/cache';
import { forgetSharedFonts } from '../src/lib/print/pdf-fontkit';
import { loadFonts } from '../src/lib/print/fonts';
import { buildGamePdf, type GamePdfOptions } from '../src/lib/print/sheet-job';
import { PrintPool } from '../src/lib/print/pool';
import { CHROMIUM, CHROMIUM_ARGS } from '../tests/e2e/env';
import { benchOdds } from './bench/odds';
import { benchCluster } from './bench/cluster';
import { benchArtMemory } from './bench/art-memory';
import { benchUploadMemory } from './bench/upload-memory';
import { benchPdfx } from './bench/pdfx';
import { writeChromiumSheets } from './bench/chromium-sheets';
import { benchCliRace } from './bench/cli-race';
import { benchServer } from './bench/server';
import { benchPreview } from './bench/preview';

const { values: flags } = parseArgs({
	options: { repeats: { type: 'string' }, 'no-chromium': { type: 'boolean' }, 'no-server': { type: 'boolean' }, only: { type: 'string' }, 'memory-child': { type: 'boolean' } }
});
const REPEATS = Math.max(1, Number(flags.repeats ?? 5));
/** The job every scenario runs: A4, spaced, long-edge duplex, crop marks, cutting guide. */
const JOB: GamePdfOptions = { paper: 'a4', layout: 'spaced', duplex: 'long', marks: true, sets: 1, colour: 'rgb', date: '2026-01-01' };

/* ------------------------------------------------------------ measuring */

const MB = 1024 * 1024;

/** Peak memory: sampled on a timer and from progress callbacks (the engine's loops block timers). */
class MemorySampler {
	peakRss = 0;
	peakHeap = 0;
	private timer?: NodeJS.Timeout;
	private calls = 0;
	start() {
		this.peakRss = 0;
		this.peakHeap = 0;
		this.sample(true);
		this.timer = setInterval(() => this.sample(true), 5);
		return this;
	}
	sample(full = false) {
		if (!full && ++this.calls % 25) {
			this.peakRss = Math.max(this.peakRss, process.memoryUsage.rss());
			return;
		}
		const m = process.memoryUsage();
		this.peakRss = Math.max(this.peakRss, m.rss);
		this.peakHeap = Math.max(this.peakHeap, m.heapUsed);
	}
	stop() {
		clearInterval(this.timer);
		this.sample(true);
		return { peakRssMb: round(this.peakRss / MB), peakHeapMb: round(this.peakHeap / MB) };
	}
}

interface Series {
	ms: number[];
	minMs: number;
	medianMs: number;
	maxMs: number;
}

function series(ms: number[]): Series {
	const s = [...ms].sort((a, b) => a - b);
	return { ms: ms.map(round), minMs: round(s[0]), medianMs: round(s[Math.floor(s.length / 2)]), maxMs: round(s[s.length - 1]) };
}

const round = (v: number) => Math.round(v * 10) / 10;
const fmtMs = (s: Series) => `${s.minMs.toFixed(0)} / ${s.medianMs.toFixed(0)} / ${s.maxMs.toFixed(0)}`;
const kb = (n: number) => `${Math.round(n / 1024)} KB`;

async function timed<T>(run: () => Promise<T>): Promise<{ ms: number; value: T }> {
	const t = performance.now();
	const value = await run();
	return { ms: performance.now() - t, value };
}

/* ------------------------------------------------------- synthetic game */

/**
 * A game of `distinct` cards, each printed `copies` times: 6 runners × steps 1–9 movement cards
 * first (54), then wager cards (3 bet types × 6 runners × tiers 1–12), with the demo's art.
 */
function syntheticGame(demo: Game, distinct: number, copies: number): Game {
	const cards: Card[] = [];
	for (const r of demo.runners)
		for (let steps = 1; steps <= 9; steps++)
			cards.push({ id: `bench.mv.${r.id}.${steps}`, kindId: 'kd-movement', name: `${r.name} ${steps}`, data: { type: 'movement', runnerId: r.id, steps }, copies });
	const bets: BetType[] = ['stage', 'winner', 'loser'];
	for (let tier = 1; tier <= 12; tier++)
		for (const betType of bets)
			for (const r of demo.runners)
				cards.push({
					id: `bench.wg.${betType}.${r.id}.${tier}`,
					kindId: 'kd-wager',
					name: `${r.name} ${betType} tier ${tier}`,
					data: { type: 'wager', betType, runnerId: r.id, tier, moneyTableId: `mt-${betType}-${Math.min(tier, 3)}` },
					copies
				});
	if (distinct > cards.length) throw new Error(`at most ${cards.length} distinct cards`);
	return { ...structuredClone(demo), name: `Bench game ${distinct} × ${copies}`, slug: `bench-${distinct}x${copies}`, cards: cards.slice(0, distinct) };
}

const cardCount = (g: Game) => g.cards.reduce((n, c) => n + c.copies, 0);

/* --------------------------------------------------------------- Paddock */

interface EngineResult {
	game: string;
	cards: number;
	distinctCards: number;
	sheets: number;
	pages: number;
	fileBytes: number;
	cold: Series;
	cached: Series;
	oneCardChanged: Series;
	/** Faces laid out again per one-card-changed rebuild. */
	oneCardMisses: number[];
	memory: { peakRssMb: number; peakHeapMb: number };
}

async function benchEngine(label: string, game: Game, art: Map<string, Uint8Array>): Promise<EngineResult> {
	const sampler = new MemorySampler().start();
	const onProgress = () => sampler.sample();
	const cold: number[] = [];
	let last!: Awaited<ReturnType<typeof buildGamePdf>>;
	for (let i = 0; i < REPEATS; i++) {
		// Cold: nothing laid out, decoded or shaped yet (fonts stay loaded, as in a running server).
		const cache = new PrintCache();
		forgetSharedFonts();
		const r = await timed(() => buildGamePdf(game, art, { ...JOB, cache, onProgress }));
		cold.push(r.ms);
		last = r.value;
	}
	const cache = new PrintCache();
	await buildGamePdf(game, art, { ...JOB, cache });
	const cached: number[] = [];
	for (let i = 0; i < REPEATS; i++) cached.push((await timed(() => buildGamePdf(game, art, { ...JOB, cache, onProgress }))).ms);
	const changed: number[] = [];
	const misses: number[] = [];
	const edited = structuredClone(game);
	for (let i = 0; i < REPEATS; i++) {
		// A different card each time, renamed (its name is printed on the face).
		const card = edited.cards[(i * 17) % edited.cards.length];
		card.name = `${card.name} (edit ${i + 1})`;
		cache.resetStats();
		changed.push((await timed(() => buildGamePdf(edited, art, { ...JOB, cache, onProgress }))).ms);
		misses.push(cache.stats().layout.misses);
	}
	const memory = sampler.stop();
	console.log(`  ${label}: done`);
	return {
		game: label,
		cards: cardCount(game),
		distinctCards: game.cards.length,
		sheets: last.sheets,
		pages: last.pages,
		fileBytes: last.pdf.length,
		cold: series(cold),
		cached: series(cached),
		oneCardChanged: series(changed),
		oneCardMisses: misses,
		memory
	};
}

/* -------------------------------------------------------------- chromium */

interface ChromiumResult {
	game: string;
	facesPrerendered: number;
	prerenderMs: number;
	withLaunch: Series;
	pageOnly: Series;
	/** Paddock's cold build of the same game, run just before each chromium run (the pairs see the same load). */
	paddockCold: Series;
	/** Medians of the pairwise ratios chromium ÷ Paddock. */
	ratioWithLaunch: number;
	ratioPageOnly: number;
	fileBytes: number;
	pages: number;
}

/** Chromium printing the same sheets (./bench/chromium-sheets.ts) from inside one process. */
async function benchChromium(label: string, game: Game, art: Map<string, Uint8Array>): Promise<ChromiumResult> {
	const paddockCold = async () => {
		forgetSharedFonts();
		return (await timed(() => buildGamePdf(game, art, { ...JOB, cache: new PrintCache() }))).ms;
	};
	const { chromium } = await import('@playwright/test');
	const dir = mkdtempSync(join(tmpdir(), 'paddock-bench-'));
	try {
		const sheets = await writeChromiumSheets(game, art, JOB, dir);
		const htmlPath = sheets.htmlPath;
		const pre = { ms: sheets.prerenderMs };
		const files = { size: sheets.faces };
		const pages = { length: sheets.pages };

		const withLaunch: number[] = [];
		const pageOnly: number[] = [];
		const paddock: number[] = [];
		let pdf = new Uint8Array();
		for (let i = 0; i < REPEATS; i++) {
			paddock.push(await paddockCold());
			const t0 = performance.now();
			const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
			try {
				const page = await browser.newPage();
				const t1 = performance.now();
				await page.goto(pathToFileURL(htmlPath).href, { waitUntil: 'load' });
				pdf = new Uint8Array(await page.pdf({ preferCSSPageSize: true, printBackground: true }));
				pageOnly.push(performance.now() - t1);
			} finally {
				await browser.close();
			}
			withLaunch.push(performance.now() - t0);
		}
		console.log(`  chromium, ${label}: done`);
		return {
			game: label,
			facesPrerendered: files.size,
			prerenderMs: round(pre.ms),
			withLaunch: series(withLaunch),
			pageOnly: series(pageOnly),
			paddockCold: series(paddock),
			ratioWithLaunch: round(series(withLaunch.map((c, i) => c / paddock[i])).medianMs),
			ratioPageOnly: round(series(pageOnly.map((c, i) => c / paddock[i])).medianMs),
			fileBytes: pdf.length,
			pages: pages.length
		};
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

/* ---------------------------------------------------------------- memory */

/**
 * The 1,000-card build alone in a fresh process, so its peak is not mixed with the rest of the
 * benchmark: RSS before the build (runtime, modules, fonts, the demo art) and the process's
 * peak (getrusage maxRSS) after a cold build and a rebuild.
 */
async function memoryChild() {
	const { game: demo, art } = await demoGameWithArt();
	await loadFonts();
	const big = syntheticGame(demo, 100, 10);
	const baseline = process.memoryUsage();
	const cache = new PrintCache();
	const sampler = new MemorySampler().start();
	const cold = await timed(() => buildGamePdf(big, art, { ...JOB, cache, onProgress: () => sampler.sample() }));
	await buildGamePdf(big, art, { ...JOB, cache, onProgress: () => sampler.sample() });
	const sampled = sampler.stop();
	process.stdout.write(
		JSON.stringify({
			baselineRssMb: round(baseline.rss / MB),
			baselineHeapMb: round(baseline.heapUsed / MB),
			peakRssMb: round((process.resourceUsage().maxRSS * 1024) / MB),
			peakHeapMb: sampled.peakHeapMb,
			coldMs: round(cold.ms)
		})
	);
}

function measureMemoryInChild(): { baselineRssMb: number; baselineHeapMb: number; peakRssMb: number; peakHeapMb: number; coldMs: number } {
	const run = spawnSync(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), '--memory-child'], {
		encoding: 'utf8',
		maxBuffer: 1 << 20
	});
	if (run.status !== 0) throw new Error(`memory child failed: ${run.stderr}`);
	return JSON.parse(run.stdout.trim().split('\n').at(-1)!);
}

/* ------------------------------------------------------------------ main */

async function main() {
	if (flags.only !== undefined) {
		if (flags.only === 'server') return void (await benchServer());
		if (flags.only !== 'cli') throw new Error(`--only takes cli (the print CLI against chromium) or server (the built app), not ${flags.only}`);
		const { game, art } = await demoGameWithArt();
		await benchCliRace(game, art, JOB);
		return;
	}
	const loadBefore = loadavg()[0];
	console.log(
		`Paddock print benchmark: ${REPEATS} repeats, node ${process.version}, ${cpus().length} cores, ` +
			`load average ${loadBefore.toFixed(1)} at the start (other work on the machine slows every figure)`
	);
	const t0 = performance.now();
	const { game: demo, art } = await demoGameWithArt();
	const demoArtMs = performance.now() - t0;

	// The first build of a process also loads fonts and WebAssembly: measured once, apart.
	const first = await timed(() => buildGamePdf(demo, art, { ...JOB, cache: new PrintCache() }));
	await loadFonts();

	console.log('Engine:');
	const big = syntheticGame(demo, 100, 10);
	const engine = [await benchEngine('demo game', demo, art), await benchEngine('1,000 cards (100 × 10)', big, art)];

	// File size: distinct faces, not copies.
	const sizes: { game: string; cards: number; distinct: number; bytes: number; ms: number }[] = [];
	for (const [distinct, copies] of [
		[100, 1],
		[100, 10],
		[200, 1]
	]) {
		const g = syntheticGame(demo, distinct, copies);
		forgetSharedFonts();
		const r = await timed(() => buildGamePdf(g, art, { ...JOB, cache: new PrintCache() }));
		sizes.push({ game: `${distinct} × ${copies}`, cards: cardCount(g), distinct, bytes: r.value.pdf.length, ms: round(r.ms) });
	}
	console.log('  file sizes: done');

	// Through the worker pool: a cold worker, then the same build warm.
	const pool = new PrintPool({ size: 2 });
	const plain = { ...JOB };
	const poolCold = await timed(() => pool.run({ type: 'sheets', game: big, art, options: plain }));
	const poolWarm = await timed(() => pool.run({ type: 'sheets', game: big, art, options: plain }));
	await pool.close();
	console.log('  worker pool: done');
	const memory = measureMemoryInChild();
	console.log('  memory in a fresh process: done');
	const maxRssMb = round((process.resourceUsage().maxRSS * 1024) / MB);

	const chrome: ChromiumResult[] = [];
	if (!flags['no-chromium']) {
		console.log('Chromium:');
		chrome.push(await benchChromium('demo game', demo, art));
		chrome.push(await benchChromium('1,000 cards (100 × 10)', big, art));
	}

	/* ------------------------------------------------------------ report */
	console.log(`\nDemo art rendered in ${demoArtMs.toFixed(0)} ms; first build in this process (fonts, wasm) ${first.ms.toFixed(0)} ms.`);
	console.log('\nPaddock, A4 spaced, long-edge duplex, crop marks, cutting guide (ms: min / median / max):');
	const rows = engine.map((e) => [
		e.game,
		String(e.cards),
		`${e.sheets} / ${e.pages}`,
		fmtMs(e.cold),
		fmtMs(e.cached),
		fmtMs(e.oneCardChanged),
		e.oneCardMisses.join(','),
		kb(e.fileBytes),
		`${e.memory.peakRssMb} / ${e.memory.peakHeapMb}`
	]);
	table(['game', 'cards', 'sheets/pages', 'cold', 'cached', 'one card changed', 're-laid', 'file', 'peak rss/heap MB'], rows);

	console.log('\nFile size against distinct faces and copies (cold builds):');
	table(
		['distinct × copies', 'cards', 'file', 'ms'],
		sizes.map((s) => [s.game, String(s.cards), kb(s.bytes), s.ms.toFixed(0)])
	);
	const s = Object.fromEntries(sizes.map((x) => [x.game, x.bytes]));
	const copiesGrowth = s['100 × 10'] / s['100 × 1'];
	const distinctGrowth = s['200 × 1'] / s['100 × 1'];
	// What one more copy costs against one more distinct card (both with their share of sheets).
	const bytesPerCopy = (s['100 × 10'] - s['100 × 1']) / 900;
	const bytesPerDistinct = (s['200 × 1'] - s['100 × 1']) / 100;
	console.log(
		`  10× the copies: ${copiesGrowth.toFixed(2)}× the bytes; 2× the distinct faces: ${distinctGrowth.toFixed(2)}× the bytes.\n` +
			`  One more copy adds ${Math.round(bytesPerCopy)} bytes (its share of sheets and marks); one more distinct card ${Math.round(bytesPerDistinct)} bytes.`
	);

	console.log(
		`\nWorker pool, 1,000 cards: cold worker ${poolCold.ms.toFixed(0)} ms (in worker ${poolCold.value.ms.toFixed(0)} ms), ` +
			`warm ${poolWarm.ms.toFixed(0)} ms (in worker ${poolWarm.value.ms.toFixed(0)} ms, ${poolWarm.value.jobCache.layout.misses} faces re-laid).`
	);
	console.log(`Process peak RSS so far (getrusage): ${maxRssMb} MB.`);
	console.log(
		`1,000 cards in a fresh process: RSS ${memory.baselineRssMb} MB before the build (runtime, modules, fonts, art), ` +
			`peak ${memory.peakRssMb} MB (getrusage), heap peak ${memory.peakHeapMb} MB; cold build ${memory.coldMs.toFixed(0)} ms.`
	);

	const ratios: { game: string; withLaunch: number; pageOnly: number }[] = [];
	if (chrome.length) {
		console.log('\nChromium page.pdf() of the same sheets from pre-rendered 300 dpi PNGs (ms: min / median / max):');
		table(
			['game', 'PNGs pre-rendered (not counted)', 'launch + load + pdf', 'load + pdf', 'Paddock cold, paired', 'pages', 'file'],
			chrome.map((c) => [
				c.game,
				`${c.facesPrerendered} in ${c.prerenderMs.toFixed(0)} ms`,
				fmtMs(c.withLaunch),
				fmtMs(c.pageOnly),
				fmtMs(c.paddockCold),
				String(c.pages),
				kb(c.fileBytes)
			])
		);
		for (const c of chrome) ratios.push({ game: c.game, withLaunch: c.ratioWithLaunch, pageOnly: c.ratioPageOnly });
		console.log(
			'  chromium ÷ Paddock cold, median of the paired runs: ' +
				ratios.map((r) => `${r.game}: ${r.withLaunch}× with chromium's launch, ${r.pageOnly}× without`).join('; ')
		);
		const withPrerender = chrome.map((c) => `${c.game}: ${round((c.prerenderMs + c.pageOnly.medianMs) / c.paddockCold.medianMs)}×`).join('; ');
		console.log(`  counting the PNG pre-render too (what chromium needs before it can print): ${withPrerender}`);
	}

	const bigE = engine[1];
	const targets = {
		fiveTimesChromium: ratios.length ? ratios.every((r) => r.pageOnly >= 5) : null,
		thousandCardsUnder3s: bigE.cold.maxMs < 3000,
		thousandCardsUnder400MB: memory.peakRssMb < 400,
		oneCardChangeUnderFifthOfCold: engine.every((e) => e.oneCardChanged.medianMs < e.cold.medianMs / 5),
		// A copy costs a placement and its share of pages; a distinct card costs its drawing.
		sizeGrowsWithDistinctFacesNotCopies: bytesPerCopy * 10 < bytesPerDistinct
	};
	console.log('\nTargets:');
	console.log(
		`  ≥ 5× faster than chromium (load + pdf, paired):  ${yes(targets.fiveTimesChromium)}` +
			(ratios.length ? ` (${ratios.map((r) => `${r.pageOnly}×`).join(', ')})` : '')
	);
	console.log(`  1,000 cards cold under 3 s (slowest run):        ${yes(targets.thousandCardsUnder3s)} (${bigE.cold.maxMs.toFixed(0)} ms)`);
	console.log(`  1,000 cards under 400 MB peak RSS:               ${yes(targets.thousandCardsUnder400MB)} (${memory.peakRssMb} MB in its own process)`);
	console.log(
		`  one card changed under a fifth of cold (median): ${yes(targets.oneCardChangeUnderFifthOfCold)} (` +
			engine
				.map((e) => `${e.game}: ${(e.oneCardChanged.medianMs / e.cold.medianMs).toFixed(2)}, fastest runs ${(e.oneCardChanged.minMs / e.cold.minMs).toFixed(2)}`)
				.join('; ') +
			')'
	);
	console.log(`  file size grows with distinct faces, not copies: ${yes(targets.sizeGrowsWithDistinctFacesNotCopies)}`);

	writeFileSync(
		'bench-results.json',
		JSON.stringify(
			{
				when: new Date().toISOString(),
				node: process.version,
				cores: cpus().length,
				loadAverage: { start: Math.round(loadBefore * 10) / 10, end: Math.round(loadavg()[0] * 10) / 10 },
				repeats: REPEATS,
				job: JOB,
				demoArtMs: round(demoArtMs),
				firstBuildInProcessMs: round(first.ms),
				engine,
				fileSizes: sizes,
				fileSizeGrowth: {
					tenTimesCopies: Math.round(copiesGrowth * 100) / 100,
					twiceDistinct: Math.round(distinctGrowth * 100) / 100,
					bytesPerCopy: Math.round(bytesPerCopy),
					bytesPerDistinctCard: Math.round(bytesPerDistinct)
				},
				pool: { coldMs: round(poolCold.ms), warmMs: round(poolWarm.ms), warmMisses: poolWarm.value.jobCache.layout.misses },
				processPeakRssMb: maxRssMb,
				thousandCardsOwnProcess: memory,
				chromium: chrome,
				chromiumOverPaddock: ratios,
				targets,
				odds: await benchOdds(),
				cluster: await benchCluster(),
				artMemory: await benchArtMemory(),
				uploadMemory: await benchUploadMemory(),
				pdfx: await benchPdfx(),
				cliRace: flags['no-chromium'] ? null : await benchCliRace(demo, art, JOB),
				server: flags['no-server'] ? null : await benchServer(),
				preview: flags['no-chromium'] ? null : await benchPreview()
			},
			null,
			'\t'
		) + '\n'
	);
	console.log(`\nLoad average at the end: ${loadavg()[0].toFixed(1)}. Wrote bench-results.json`);
}

const yes = (v: boolean | null) => (v === null ? 'not measured' : v ? 'met' : 'NOT met');

function table(head: string[], rows: string[][]) {
	const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
	const line = (cells: string[]) => '  ' + cells.map((c, i) => c.padEnd(widths[i])).join('  ');
	console.log(line(head));
	console.log('  ' + widths.map((w) => '-'.repeat(w)).join('  '));
	for (const r of rows) console.log(line(r));
}

(flags['memory-child'] ? memoryChild() : main()).catch((e) => {
	console.error(e);
	process.exitCode = 1;
});
