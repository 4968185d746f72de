/**
 * `npm run odds -- --scenario FILE (--exact | --samples N [--seed S]) [--json]`: a stage's odds
 * from a scenario file, with the same checks and engine as the app's API (src/lib/odds).
 * Monte Carlo runs on worker threads, one per core (--threads to change).
 *
 *   npm run odds -- --scenario stage.json --exact --json
 *   npm run odds -- --scenario stage.json --samples 1000000 --seed 7
 */
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { OddsPool } from '../src/lib/odds/parallel';
import { DEFAULT_SEED, OddsRequestSchema, runStage, stageReport, type StageReport } from '../src/lib/odds/report';
import { describeIssues } from '../src/lib/odds/scenario';

const IN_PROCESS_SAMPLES = 200_000;

const USAGE = `Usage: npm run odds -- --scenario FILE (--exact | --samples N [--seed S]) [--json] [--threads T]

  --scenario FILE   the stage: finish, stacks, rogue, modifiers, rules, deck (JSON)
  --exact           every order of the deck (at most 12 cards)
  --samples N       Monte Carlo with N random orders; --seed S makes it repeatable (default ${DEFAULT_SEED})
  --json            print { "method", "samples", "stage": { runner: [P(1st), P(2nd), …] }, … }
  --threads T       worker threads for Monte Carlo (default: one per core)`;

function fail(message: string, usage = false): never {
	console.error(message + (usage ? `\n\n${USAGE}` : ''));
	process.exit(2);
}

async function main(): Promise<void> {
	let values;
	try {
		({ values } = parseArgs({
			strict: true,
			options: {
				scenario: { type: 'string' },
				exact: { type: 'boolean' },
				samples: { type: 'string' },
				seed: { type: 'string' },
				json: { type: 'boolean' },
				threads: { type: 'string' },
				help: { type: 'boolean', short: 'h' }
			}
		}));
	} catch (e) {
		fail((e as Error).message, true);
	}
	if (values.help) {
		console.log(USAGE);
		return;
	}
	if (!values.scenario) fail('--scenario FILE is required', true);
	if (values.exact === !!values.samples) fail('Give either --exact or --samples N', true);
	const number = (flag: string, v: string | undefined) => {
		if (v === undefined) return undefined;
		const n = Number(v);
		if (!Number.isInteger(n)) fail(`--${flag} must be a whole number, not “${v}”`);
		return n;
	};
	let raw: unknown;
	try {
		raw = JSON.parse(readFileSync(values.scenario, 'utf8'));
	} catch (e) {
		fail(`Cannot read the scenario ${values.scenario}: ${(e as Error).message}`);
	}
	if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) fail('The scenario file must hold one JSON object');
	const body = values.exact
		? { ...raw, exact: true }
		: { ...raw, samples: number('samples', values.samples), seed: number('seed', values.seed) };
	const parsed = OddsRequestSchema.safeParse(body);
	if (!parsed.success) fail(`The scenario was refused:\n  ${describeIssues(parsed.error).join('\n  ')}`);
	const { scenario, method } = parsed.data;

	let report: StageReport;
	// Small runs are quicker on this thread than starting workers (the answer is the same).
	if ('exact' in method || method.samples <= IN_PROCESS_SAMPLES) report = runStage(scenario, method);
	else {
		const threads = number('threads', values.threads);
		const pool = new OddsPool({ size: threads });
		const seed = method.seed ?? DEFAULT_SEED;
		const started = performance.now();
		const tty = process.stderr.isTTY && !values.json;
		try {
			const out = await pool.run(
				{ kind: 'stage', scenario, samples: method.samples, seed },
				{ onProgress: (done, total) => tty && process.stderr.write(`\r${Math.round((100 * done) / total)} %`) }
			);
			if (tty) process.stderr.write('\r');
			if (out.kind !== 'stage') throw new Error('unexpected answer');
			report = stageReport(out.odds, { samples: method.samples, seed }, { ms: performance.now() - started });
		} finally {
			await pool.close();
		}
	}

	if (values.json) {
		console.log(JSON.stringify(report, null, 2));
		return;
	}
	const runners = Object.keys(report.stage);
	const places = runners.map((_, i) => `P(${i + 1})`);
	console.log(
		report.method === 'exact'
			? `Exact: every order of ${scenario.deck.length} cards (${report.states} states), ${report.ms?.toFixed(1)} ms`
			: `Monte Carlo: ${report.samples!.toLocaleString('en-GB')} samples, seed ${report.seed}, ${report.ms?.toFixed(0)} ms (± one standard error)`
	);
	const width = Math.max(6, ...runners.map((r) => r.length));
	console.log(['runner'.padEnd(width), ...places.map((p) => p.padStart(16))].join(' '));
	for (const r of runners) {
		const cells = report.stage[r].map((p, i) => {
			const se = report.standardErrors?.[r][i];
			return (se === undefined ? p.toFixed(4) : `${p.toFixed(4)} ± ${se.toFixed(4)}`).padStart(16);
		});
		console.log([r.padEnd(width), ...cells].join(' '));
	}
	console.log(`The race ends during this stage with probability ${report.raceEnds.toFixed(4)}.`);
}

main().catch((e) => {
	console.error((e as Error).message ?? e);
	process.exitCode = 1;
});
