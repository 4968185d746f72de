/** Worker threads give the single-thread answer for the same seed, report progress, and cancel. */
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { build } from 'esbuild';
import { afterAll, describe, expect, it } from 'vitest';
import { demoGame } from '../demo/demo';
import { OddsCancelled, OddsPool } from './parallel';
import { raceSetupFromGame, simulateRaces } from './race';
import { ScenarioSchema } from './scenario';
import { CHUNK_SAMPLES, compileStage, monteCarloStage } from './stage';

const scenario = ScenarioSchema.parse({
	finish: 10,
	stacks: [
		{ space: 1, bottomToTop: ['amber', 'teal'] },
		{ space: 3, bottomToTop: ['coal', 'soot'] }
	],
	rogue: { runner: 'soot' },
	deck: ['amber', 'teal', 'coal', 'soot', 'amber', 'coal'].map((runner, i) => ({ runner, steps: 1 + (i % 3) }))
});

const pool = new OddsPool({ size: 2 });
afterAll(() => pool.close());

describe('the odds pool', () => {
	it('splits samples over threads and gives the one-thread answer', async () => {
		const samples = 3 * CHUNK_SAMPLES + 123;
		const seen: number[] = [];
		const out = await pool.run({ kind: 'stage', scenario, samples, seed: 11 }, { onProgress: (done) => seen.push(done) });
		const here = monteCarloStage(compileStage(scenario), samples, 11);
		expect(out.kind === 'stage' && out.odds).toEqual(here);
		expect(seen.at(-1)).toBe(samples);
		expect(seen.length).toBeGreaterThan(2);
	}, 60_000);

	it('runs whole races the same way', async () => {
		const setup = raceSetupFromGame(demoGame(), 3);
		const out = await pool.run({ kind: 'race', setup, races: 2000, seed: 5 });
		expect(out.kind === 'race' && out.odds).toEqual(simulateRaces(setup, 2000, 5));
	}, 60_000);

	it('gives the same answer from the worker compiled to plain JavaScript (as `npm run build` makes it)', async () => {
		// Inside the project, so the compiled file finds the packages it leaves in node_modules.
		const cache = new URL('../../../node_modules/.cache/', import.meta.url).pathname;
		mkdirSync(cache, { recursive: true });
		const dir = mkdtempSync(join(cache, 'paddock-odds-worker-'));
		const compiled = new OddsPool({ size: 2, workerPath: join(dir, 'odds-worker.js') });
		try {
			await build({
				entryPoints: [new URL('./worker.ts', import.meta.url).pathname],
				outfile: join(dir, 'odds-worker.js'),
				bundle: true,
				platform: 'node',
				format: 'esm',
				packages: 'external',
				logLevel: 'error'
			});
			const samples = 2 * CHUNK_SAMPLES + 7;
			const out = await compiled.run({ kind: 'stage', scenario, samples, seed: 3 });
			expect(out.kind === 'stage' && out.odds).toEqual(monteCarloStage(compileStage(scenario), samples, 3));
		} finally {
			await compiled.close();
			rmSync(dir, { recursive: true, force: true });
		}
	}, 60_000);

	it('stops when cancelled', async () => {
		const controller = new AbortController();
		const run = pool.run(
			{ kind: 'stage', scenario, samples: 100 * CHUNK_SAMPLES, seed: 1 },
			{ signal: controller.signal, onProgress: (done) => done > 0 && controller.abort() }
		);
		await expect(run).rejects.toBeInstanceOf(OddsCancelled);
		// The pool is free for the next run.
		const next = await pool.run({ kind: 'stage', scenario, samples: 1000, seed: 1 });
		expect(next.kind).toBe('stage');
	}, 60_000);
});
