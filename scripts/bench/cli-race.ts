/**
 * The print CLI against chromium as whole processes, start to finish, alternated in one run:
 * `node build/print.js --demo … --out sheets.pdf` (compiled JavaScript, demo art kept between
 * runs) against `chromium --headless --print-to-pdf` of the same sheets as HTML with the faces
 * pre-rendered at 300 dpi (./chromium-sheets.ts; the pre-render is not counted for chromium).
 *
 * The CLI runs two ways in each round: warm, with its disk cache from the earlier runs (a user's
 * repeat run), and cold, with an empty cache directory (a machine's first run: every face laid
 * out and drawn, every picture encoded; the demo art itself is kept, as it is made once).
 * Target, for each: the CLI at least 5× faster than chromium (median of the paired ratios).
 */
import { spawn } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Game } from '../../src/lib/game/model';
import type { GamePdfOptions } from '../../src/lib/print/sheet-job';
import { CHROMIUM, CHROMIUM_ARGS } from '../../tests/e2e/env';
import { buildPrint } from '../build-print.js';
import { isStale } from '../build-if-stale.js';
import { writeChromiumSheets } from './chromium-sheets';

const ROOT = new URL('../..', import.meta.url).pathname;

function run(cmd: string, args: string[]): Promise<number> {
	const t = performance.now();
	return new Promise((resolve, reject) => {
		const child = spawn(cmd, args, { cwd: ROOT, stdio: ['ignore', 'ignore', 'pipe'] });
		let err = '';
		child.stderr.on('data', (d) => (err += d));
		child.on('error', reject);
		child.on('exit', (code) => (code === 0 ? resolve(performance.now() - t) : reject(new Error(`${cmd} exited ${code}: ${err.slice(-500)}`))));
	});
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const r1 = (v: number) => Math.round(v * 10) / 10;

export async function benchCliRace(demo: Game, art: Map<string, Uint8Array>, job: GamePdfOptions, alternations = 5) {
	if (isStale('build/print.js', ['src/lib', 'scripts/print.ts', 'templates', 'package.json'])) await buildPrint({ quiet: true });
	const dir = mkdtempSync(join(tmpdir(), 'paddock-race-'));
	try {
		const sheets = await writeChromiumSheets(demo, art, job, dir);
		const cliArgs = (cache: string) => [
			'build/print.js',
			'--demo',
			'--paper',
			String(job.paper),
			'--layout',
			job.layout,
			'--duplex',
			job.duplex,
			'--marks',
			job.marks ? 'yes' : 'no',
			'--guide',
			'no',
			'--cache',
			cache,
			'--out',
			join(dir, 'cli.pdf')
		];
		const warmCache = join(dir, 'cache');
		let coldRuns = 0;
		const coldCache = () => {
			const d = join(dir, `cold-${coldRuns++}`);
			mkdirSync(d);
			return d;
		};
		const chromeArgs = [...CHROMIUM_ARGS, '--no-pdf-header-footer', `--print-to-pdf=${join(dir, 'chromium.pdf')}`, pathToFileURL(sheets.htmlPath).href];
		// One untimed run of each: the CLI keeps the demo art it draws the first time, and fills the warm cache.
		await run(process.execPath, cliArgs(warmCache));
		await run(CHROMIUM, chromeArgs);
		const cli: number[] = [];
		const cold: number[] = [];
		const chromium: number[] = [];
		const loads: number[] = [];
		for (let i = 0; i < alternations; i++) {
			// Rotate the order, so none always meets another's after-effects.
			const runs = [
				async () => cli.push(await run(process.execPath, cliArgs(warmCache))),
				async () => cold.push(await run(process.execPath, cliArgs(coldCache()))),
				async () => chromium.push(await run(CHROMIUM, chromeArgs))
			];
			for (let k = 0; k < runs.length; k++) await runs[(i + k) % runs.length]();
			loads.push(loadavg()[0]);
		}
		const ratio = median(chromium.map((c, i) => c / cli[i]));
		const coldRatio = median(chromium.map((c, i) => c / cold[i]));
		const result = {
			alternations,
			cliMs: cli.map(r1),
			cliColdMs: cold.map(r1),
			chromiumMs: chromium.map(r1),
			cliMedianMs: r1(median(cli)),
			cliColdMedianMs: r1(median(cold)),
			chromiumMedianMs: r1(median(chromium)),
			/** A repeat run (its cache filled). */
			ratio: r1(ratio),
			/** A first run (an empty cache). */
			coldRatio: r1(coldRatio),
			met: ratio >= 5,
			coldMet: coldRatio >= 5,
			facesPrerendered: sheets.faces,
			prerenderMs: r1(sheets.prerenderMs),
			cliPdfBytes: statSync(join(dir, 'cli.pdf')).size,
			chromiumPdfBytes: statSync(join(dir, 'chromium.pdf')).size,
			loadAverage: r1(median(loads))
		};
		console.log(
			`\nWhole processes, demo game (${alternations} alternations, load ${result.loadAverage}): CLI median ${result.cliMedianMs.toFixed(0)} ms with its cache, ` +
				`${result.cliColdMedianMs.toFixed(0)} ms with an empty cache; chromium --print-to-pdf median ${result.chromiumMedianMs.toFixed(0)} ms ` +
				`(its ${sheets.faces} face PNGs pre-rendered beforehand, ${result.prerenderMs.toFixed(0)} ms, not counted).\n` +
				`  CLI ≥ 5× faster than chromium, whole process, repeat run (median of paired ratios): ${result.ratio}× — ${result.met ? 'met' : 'NOT met'}\n` +
				`  CLI ≥ 5× faster than chromium, whole process, first run with an empty cache: ${result.coldRatio}× — ${result.coldMet ? 'met' : 'NOT met'}`
		);
		return result;
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}
