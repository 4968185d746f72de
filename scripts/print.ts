/**
 * `npm run print -- …`: the print engine from the command line, with the same options, checks
 * and job functions as the app's routes (src/lib/print/job.ts).
 *
 *   npm run print -- --demo --paper a4 --duplex long --out sheets.pdf
 *   npm run print -- --bundle game.zip --paper letter --layout butted --marks no --sets 2 --out sheets.pdf
 *   npm run print -- --bundle game.zip --press CARD_ID --out card.pdf
 *   npm run print -- --demo --pngs faces.zip
 *   npm run print -- --calibration --paper a4 --duplex short --out calibration.pdf
 */
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { BundleError, readBundle } from '../src/lib/game/bundle';
import { demoArtPieces, demoGameWithArt } from '../src/lib/demo/demo-art';
import { demoGame } from '../src/lib/demo/demo';
import { hashOf } from '../src/lib/print/cache';
import type { Game } from '../src/lib/game/model';
import { buildCalibrationPdf } from '../src/lib/print/calibration';
import { buildCardPressPdf } from '../src/lib/print/press-job';
import { buildCardsPngZip, PNG_DPI_DEFAULT } from '../src/lib/print/png-job';
import { buildGamePdf } from '../src/lib/print/sheet-job';
import { defaultDiskCacheDir, DEFAULT_DISK_CACHE_BYTES, PrintDiskCache } from '../src/lib/print/disk-cache';
import { parsePrintOptions, PrintOptionsError } from '../src/lib/print/options';

const USAGE = `Usage: npm run print -- (--demo | --bundle game.zip) [options] --out file.pdf
       npm run print -- (--demo | --bundle game.zip) --press CARD_ID [--crop-marks] [--colour cmyk|rgb] --out card.pdf
       npm run print -- (--demo | --bundle game.zip) --pngs faces.zip [--dpi 300] [--kinds a,b]
       npm run print -- --calibration [--paper a4] [--duplex long|short] [--orientation portrait|landscape] --out cal.pdf

Sheet options (the same as the app's print page):
  --paper a4|a3|letter|tabloid|custom:<w>x<h>   sheet size, mm for custom (default a4)
  --layout spaced|butted|fold                    (default spaced)
  --duplex none|long|short                       flip edge of a duplex printer (default none)
  --marks yes|no                                 crop marks (default yes)
  --sets 1..50                                   complete sets of the cards (default 1)
  --margin MM                                    printer's unprintable border (default 5)
  --colour rgb|cmyk                              (default rgb)
  --guide yes|no                                 cutting guide as the last page (default yes)
  --kinds ID,ID                                  only these card kinds
  --back-x MM --back-y MM                        the printer's back offset from the calibration sheet
  --title TEXT --version-label TEXT              for the sheet label

Cache (sheet PDFs): faces already laid out and drawn, art pixels and font data are kept in
  --cache DIR                                    (default ${defaultDiskCacheDir()})
  --no-cache                                     neither read nor write it
so a repeat run only assembles the PDF, and a changed card is drawn again alone. Entries are
keyed by everything a face is made from; the directory is kept under ${DEFAULT_DISK_CACHE_BYTES / 1024 / 1024} MB (least recently
used go first) and is safe to delete at any time.

Sizes and bleed are common practice: confirm them with your print shop before a paid run.`;

/**
 * The demo game with its art, drawn once and kept (keyed by the drawings and the
 * game they belong to) under node_modules/.cache, so a run does not redraw the same pictures every time.
 */
async function keptDemo(): Promise<{ game: Game; art: Map<string, Uint8Array> }> {
	const key = hashOf([demoArtPieces().map((p) => [p.key, p.svg, p.widthPx]), demoGame()]).slice(0, 20);
	// From scripts/ (source) and from build/ (compiled) alike, the project's node_modules/.cache.
	const dir = fileURLToPath(new URL('../node_modules/.cache/paddock/', import.meta.url));
	const file = join(dir, `demo-${key}.json`);
	try {
		const kept = JSON.parse(readFileSync(file, 'utf8')) as { game: Game; art: [string, string][] };
		return { game: kept.game, art: new Map(kept.art.map(([sha, b64]) => [sha, new Uint8Array(Buffer.from(b64, 'base64'))])) };
	} catch {
		// Not made yet (or unreadable): draw it and keep it.
	}
	const made = await demoGameWithArt();
	try {
		mkdirSync(dir, { recursive: true });
		writeFileSync(file, JSON.stringify({ game: made.game, art: [...made.art].map(([sha, b]) => [sha, Buffer.from(b).toString('base64')]) }));
	} catch {
		// A read-only checkout still prints; it just draws the art each time.
	}
	return made;
}

class UsageError extends Error {}
/** Bad input that is not a misuse of the flags (a missing file): no usage text. */
class InputError extends Error {}

function fail(message: string): never {
	throw new UsageError(message);
}

async function main(argv: string[]): Promise<void> {
	let parsed;
	try {
		parsed = parseArgs({
			args: argv,
			strict: true,
			allowPositionals: false,
			options: {
				demo: { type: 'boolean' },
				bundle: { type: 'string' },
				out: { type: 'string', short: 'o' },
				press: { type: 'string' },
				pngs: { type: 'string' },
				calibration: { type: 'boolean' },
				paper: { type: 'string' },
				layout: { type: 'string' },
				duplex: { type: 'string' },
				marks: { type: 'string' },
				sets: { type: 'string' },
				margin: { type: 'string' },
				colour: { type: 'string' },
				guide: { type: 'string' },
				kinds: { type: 'string' },
				'back-x': { type: 'string' },
				'back-y': { type: 'string' },
				title: { type: 'string' },
				'version-label': { type: 'string' },
				'crop-marks': { type: 'boolean' },
				dpi: { type: 'string' },
				cache: { type: 'string' },
				'no-cache': { type: 'boolean' },
				orientation: { type: 'string' },
				help: { type: 'boolean', short: 'h' }
			}
		});
	} catch (e) {
		fail((e as Error).message);
	}
	const v = parsed.values;
	if (v.help) {
		console.log(USAGE);
		return;
	}
	const modes = [v.press !== undefined, v.pngs !== undefined, !!v.calibration].filter(Boolean).length;
	if (modes > 1) fail('choose one of --press, --pngs and --calibration');

	// The same parsing as the route's query string.
	const options = parsePrintOptions({
		paper: v.paper,
		layout: v.layout,
		duplex: v.duplex,
		marks: v.marks,
		sets: v.sets,
		margin: v.margin,
		colour: v.colour,
		guide: v.guide,
		kinds: v.kinds,
		backX: v['back-x'],
		backY: v['back-y']
	});

	if (v.calibration) {
		if (v.demo || v.bundle) fail('--calibration needs no game');
		const out = v.out ?? fail('--out is needed: where to write the calibration sheet');
		const orientation = v.orientation ?? 'portrait';
		if (orientation !== 'portrait' && orientation !== 'landscape') fail('--orientation is portrait or landscape');
		const pdf = await buildCalibrationPdf({
			paper: options.paper,
			duplex: options.duplex === 'short' ? 'short' : 'long',
			orientation,
			marginMm: options.marginMm ?? 5
		});
		writeFileSync(out, pdf);
		console.log(`${out}: duplex calibration sheet, 2 pages, ${kb(pdf)}`);
		return;
	}

	if (!!v.demo === !!v.bundle) fail('give exactly one of --demo and --bundle game.zip');
	const { game, art } = v.demo ? await keptDemo() : loadBundle(v.bundle!);

	if (v.pngs !== undefined) {
		const dpi = v.dpi === undefined ? PNG_DPI_DEFAULT : Number(v.dpi);
		const started = performance.now();
		const r = await buildCardsPngZip(game, art, { dpi, kinds: options.kinds, onProgress: progress('faces') });
		clearProgress();
		writeFileSync(v.pngs, r.zip);
		console.log(`${v.pngs}: ${r.files} PNG files at ${dpi} dpi with bleed, ${kb(r.zip)}, ${seconds(started)}`);
		printWarnings(r.warnings);
		return;
	}

	const out = v.out ?? fail('--out is needed: where to write the PDF');
	if (v.press !== undefined) {
		const r = await buildCardPressPdf(game, art, v.press, { colour: v.colour ? options.colour : 'cmyk', cropMarks: !!v['crop-marks'] });
		writeFileSync(out, r.pdf);
		console.log(`${out}: press file for “${cardName(game, v.press)}”, front and back, TrimBox and BleedBox set, ${kb(r.pdf)}`);
		printWarnings(r.warnings);
		return;
	}

	if (v.cache !== undefined && v['no-cache']) fail('choose --cache DIR or --no-cache');
	const disk = v['no-cache'] ? undefined : new PrintDiskCache(v.cache ?? defaultDiskCacheDir());
	const started = performance.now();
	const r = await buildGamePdf(game, art, {
		...options,
		disk,
		title: v.title,
		versionLabel: v['version-label'],
		onProgress: progress('steps')
	});
	clearProgress();
	writeFileSync(out, r.pdf);
	console.log(
		`${out}: ${r.sheets} ${r.sheets === 1 ? 'sheet' : 'sheets'} (${r.pages} pages), ${kb(r.pdf)}, ${seconds(started)}. ` +
			'Print at actual size (100 %).'
	);
	printWarnings(r.warnings);
}

function loadBundle(path: string): { game: Game; art: Map<string, Uint8Array> } {
	let bytes: Uint8Array;
	try {
		bytes = new Uint8Array(readFileSync(path));
	} catch (e) {
		const code = (e as NodeJS.ErrnoException).code;
		throw new InputError(code === 'ENOENT' ? `no such file: ${path}` : `cannot read ${path}: ${(e as Error).message}`);
	}
	return readBundle(bytes);
}

const cardName = (game: Game, id: string) => game.cards.find((c) => c.id === id)?.name ?? id;
const kb = (b: Uint8Array) => (b.length < 1024 * 1024 ? `${Math.round(b.length / 1024)} KB` : `${(b.length / 1024 / 1024).toFixed(1)} MB`);
const seconds = (since: number) => `${((performance.now() - since) / 1000).toFixed(1)} s`;

let progressShown = false;
function progress(what: string) {
	let last = 0;
	return (done: number, total: number) => {
		if (!process.stderr.isTTY) return;
		const now = performance.now();
		if (done < total && now - last < 100) return;
		last = now;
		progressShown = true;
		process.stderr.write(`\r${Math.round((100 * done) / Math.max(1, total))} % (${done} of ${total} ${what})`);
	};
}
function clearProgress() {
	if (progressShown) process.stderr.write('\r\x1b[K');
	progressShown = false;
}

function printWarnings(warnings: string[]) {
	if (!warnings.length) return;
	console.log(`${warnings.length} ${warnings.length === 1 ? 'warning' : 'warnings'}:`);
	for (const w of warnings) console.log(`  - ${w}`);
}

main(process.argv.slice(2)).catch((e: unknown) => {
	clearProgress();
	if (e instanceof UsageError) {
		console.error(`paddock print: ${e.message}\n\n${USAGE}`);
	} else if (e instanceof PrintOptionsError || e instanceof BundleError || e instanceof InputError) {
		console.error(`paddock print: ${e.message}`);
	} else {
		console.error('paddock print failed:', e);
	}
	process.exitCode = 1;
});
