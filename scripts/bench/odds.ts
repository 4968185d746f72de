/**
 * Odds lab benchmark (`npm run bench:odds`, also part of `npm run bench`): an exact eight-card
 * stage in process, Monte Carlo stage simulations per second on one thread and on every worker,
 * and 100,000 whole races of the demo game. Targets: < 50 ms; ≥ 1,000,000 / s; < 3 s.
 */
import { availableParallelism, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { demoGame } from '../../src/lib/demo/demo';
import { OddsPool } from '../../src/lib/odds/parallel';
import { raceSetupFromGame, simulateRaces } from '../../src/lib/odds/race';
import { ScenarioSchema } from '../../src/lib/odds/scenario';
import { compileStage, exactStage, monteCarloStage } from '../../src/lib/odds/stage';

/** Five runners and the rogue, two stacks, a modifier each way, eight cards of six kinds. */
export const EIGHT_CARD_STAGE = ScenarioSchema.parse({
	finish: 16,
	stacks: [
		{ space: 1, bottomToTop: ['amber', 'teal', 'coal'] },
		{ space: 3, bottomToTop: ['moss', 'soot'] },
		{ space: 6, bottomToTop: ['plum'] }
	],
	rogue: { runner: 'soot' },
	modifiers: [
		{ space: 5, steps: 1 },
		{ space: 8, steps: -1 }
	],
	deck: ['amber', 'teal', 'coal', 'moss', 'soot', 'plum', 'amber', 'coal'].map((runner, i) => ({ runner, steps: 1 + (i % 3) }))
});

export interface OddsBench {
	loadAverage: number;
	exactEightCardMs: { min: number; median: number };
	exactStates: number;
	stageSimulationsPerSecond: { oneThreadInProcess: number; oneWorker: number; allWorkers: number; workers: number };
	demoRaces: { races: number; players: number; allWorkersMs: number; oneThreadMs: number; meanStages: number };
	targets: { exactUnder50ms: boolean; millionPerSecond: boolean; racesUnder3s: boolean };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

export async function benchOdds(): Promise<OddsBench> {
	const load = loadavg()[0];
	console.log(`\nOdds lab (load average ${load.toFixed(1)} on ${availableParallelism()} cores):`);
	const compiled = compileStage(EIGHT_CARD_STAGE);
	// Warm the JIT, then time.
	for (let i = 0; i < 3; i++) exactStage(compiled);
	const exactMs: number[] = [];
	let states = 0;
	for (let i = 0; i < 15; i++) {
		const t = performance.now();
		states = exactStage(compileStage(EIGHT_CARD_STAGE)).nodes;
		exactMs.push(performance.now() - t);
	}

	const SAMPLES = 2_000_000;
	monteCarloStage(compiled, 200_000, 1);
	let t = performance.now();
	monteCarloStage(compiled, SAMPLES, 1);
	const inProcess = SAMPLES / ((performance.now() - t) / 1000);

	const rate = async (size: number) => {
		const pool = new OddsPool({ size });
		try {
			// The first run starts the threads and warms them up.
			await pool.run({ kind: 'stage', scenario: EIGHT_CARD_STAGE, samples: size * 300_000, seed: 2 });
			const start = performance.now();
			await pool.run({ kind: 'stage', scenario: EIGHT_CARD_STAGE, samples: SAMPLES * size, seed: 3 });
			return (SAMPLES * size) / ((performance.now() - start) / 1000);
		} finally {
			await pool.close();
		}
	};
	const oneWorker = await rate(1);
	const workers = availableParallelism();
	const allWorkers = await rate(workers);

	const RACES = 100_000;
	const players = 4;
	const setup = raceSetupFromGame(demoGame(), players);
	const pool = new OddsPool({ size: workers });
	let racesMs: number;
	let meanStages: number;
	try {
		await pool.run({ kind: 'race', setup, races: 20_000, seed: 1 });
		t = performance.now();
		const out = await pool.run({ kind: 'race', setup, races: RACES, seed: 2 });
		racesMs = performance.now() - t;
		meanStages = out.kind === 'race' ? out.odds.meanStages : 0;
	} finally {
		await pool.close();
	}
	t = performance.now();
	simulateRaces(setup, RACES, 2);
	const oneThreadMs = performance.now() - t;

	const result: OddsBench = {
		loadAverage: load,
		exactEightCardMs: { min: Math.min(...exactMs), median: median(exactMs) },
		exactStates: states,
		stageSimulationsPerSecond: { oneThreadInProcess: Math.round(inProcess), oneWorker: Math.round(oneWorker), allWorkers: Math.round(allWorkers), workers },
		demoRaces: { races: RACES, players, allWorkersMs: racesMs, oneThreadMs, meanStages },
		targets: {
			exactUnder50ms: median(exactMs) < 50,
			millionPerSecond: allWorkers >= 1_000_000,
			racesUnder3s: racesMs < 3000
		}
	};
	const n = (x: number) => Math.round(x).toLocaleString('en-GB');
	console.log(`  exact 8-card stage: min ${result.exactEightCardMs.min.toFixed(1)} ms, median ${result.exactEightCardMs.median.toFixed(1)} ms (${states} states; target < 50 ms)`);
	console.log(`  stage simulations/s: ${n(inProcess)} in process, ${n(oneWorker)} on 1 worker, ${n(allWorkers)} on ${workers} workers (target ≥ 1,000,000)`);
	console.log(`  ${n(RACES)} demo races (${players} players, ${meanStages.toFixed(2)} stages on average): ${n(racesMs)} ms on ${workers} workers, ${n(oneThreadMs)} ms on one thread (target < 3,000 ms)`);
	console.log(`  targets: exact ${result.targets.exactUnder50ms ? 'met' : 'NOT met'}, simulations ${result.targets.millionPerSecond ? 'met' : 'NOT met'}, races ${result.targets.racesUnder3s ? 'met' : 'NOT met'} (load average now ${loadavg()[0].toFixed(1)})`);
	return result;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
	benchOdds().catch((e) => {
		console.error(e);
		process.exitCode = 1;
	});
}
