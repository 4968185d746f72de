/**
 * The answer the CLI prints with --json and the API returns: `method`, `samples` and `stage`
 * (`{ runner: [P(1st), P(2nd), …] }`), with standard errors and the chance the race ends in this
 * stage beside them. One shape for both, built here.
 */
import { z } from 'zod';
import { EXACT_MAX_CARDS, MethodSchema, ScenarioSchema, exactLimitMessage, type Method, type Scenario } from './scenario';
import { compileStage, exactStage, monteCarloStage, type StageOdds } from './stage';
import { placeOdds, type PlaceOdds } from './wagers';

export interface StageReport {
	method: 'exact' | 'monte-carlo';
	/** Samples drawn (null for exact: every order counted). */
	samples: number | null;
	seed?: number;
	stage: PlaceOdds;
	standardErrors?: PlaceOdds;
	/** Chance a ranked runner reaches the finish during this stage. */
	raceEnds: number;
	raceEndsStandardError?: number;
	/** Distinct states the exact method visited. */
	states?: number;
	ms?: number;
}

/** Seed used when a sampled run names none. */
export const DEFAULT_SEED = 1;

export function stageReport(odds: StageOdds, method: Method, extra: { states?: number; ms?: number } = {}): StageReport {
	const sampled = 'samples' in method;
	return {
		method: sampled ? 'monte-carlo' : 'exact',
		samples: sampled ? method.samples : null,
		...(sampled ? { seed: method.seed ?? DEFAULT_SEED } : {}),
		stage: placeOdds(odds.runners, odds.places),
		...(odds.standardErrors ? { standardErrors: placeOdds(odds.runners, odds.standardErrors) } : {}),
		raceEnds: odds.raceEnds,
		...(odds.raceEndsStandardError !== undefined ? { raceEndsStandardError: odds.raceEndsStandardError } : {}),
		...extra
	};
}

/** Runs a stage on this thread (exact, or Monte Carlo without workers). */
export function runStage(scenario: Scenario, method: Method): StageReport {
	const started = performance.now();
	const compiled = compileStage(scenario);
	if ('exact' in method) {
		const odds = exactStage(compiled);
		return stageReport(odds, method, { states: odds.nodes, ms: performance.now() - started });
	}
	const odds = monteCarloStage(compiled, method.samples, method.seed ?? DEFAULT_SEED);
	return stageReport(odds, method, { ms: performance.now() - started });
}

/**
 * An odds request: the scenario's fields plus `"exact": true` or `"samples": N` (and `"seed"`).
 * Exact on a deck over the limit is refused here, naming the limit.
 */
export const OddsRequestSchema = z
	.object({ exact: z.boolean().optional(), samples: z.unknown().optional(), seed: z.unknown().optional() })
	.loose()
	.transform((body, ctx) => {
		const { exact, samples, seed, ...rest } = body;
		const method = MethodSchema.safeParse(exact === true ? { exact: true } : { samples, seed });
		if (exact === true && samples !== undefined)
			ctx.addIssue({ code: 'custom', path: ['exact'], message: 'Ask for "exact": true or for "samples", not both' });
		if (!method.success) {
			for (const issue of method.error.issues)
				ctx.addIssue({
					code: 'custom',
					path: issue.path,
					message: exact !== true && samples === undefined ? 'Ask for "exact": true or for "samples": N' : issue.message
				});
		}
		const scenario = ScenarioSchema.safeParse(rest);
		if (!scenario.success) for (const issue of scenario.error.issues) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
		if (!method.success || !scenario.success) return z.NEVER;
		if ('exact' in method.data && scenario.data.deck.length > EXACT_MAX_CARDS) {
			ctx.addIssue({ code: 'custom', path: ['deck'], message: exactLimitMessage(scenario.data.deck.length) });
			return z.NEVER;
		}
		return { scenario: scenario.data, method: method.data };
	});
export type OddsRequest = z.output<typeof OddsRequestSchema>;
