/**
 * The odds lab for the app: runs a stage scenario or whole races of a game, prices the game's
 * wager cards from the answer, keeps saved scenarios, and hands large runs to the worker pool as
 * jobs to poll (like print jobs). Small runs answer at once.
 */
import { randomUUID } from 'node:crypto';
import { and, asc, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from './db';
import { oddsScenarios } from './db/schema';
import { ApiError } from './api';
import { loadGame } from './game-store';
import { logActivity } from './activity';
import type { Game } from '$lib/game/model';
import { oddsPool, OddsCancelled, type OddsJob, type OddsJobResult } from '$lib/odds/parallel';
import { DEFAULT_SEED, OddsRequestSchema, runStage, stageReport, type StageReport } from '$lib/odds/report';
import { raceSetupFromGame, RaceSetupError, setupPlayerCounts, simulateRaces, type RaceOdds } from '$lib/odds/race';
import { MAX_SAMPLES, ScenarioSchema, describeIssues, type Scenario } from '$lib/odds/scenario';
import { placeOdds, priceWagers, type WagerPrice } from '$lib/odds/wagers';
import type { JobView, OddsAnswer, RaceAnswer, StageAnswer, WagerLine } from '$lib/odds/answer';

export type { JobView, OddsAnswer };

/** Who asks: the guard has already checked they may read the game. */
export interface OddsActor {
	userId: string;
	teamId: string;
	gameId: string;
}

/** Runs up to these sizes answer at once; larger ones become jobs. */
export const INLINE_SAMPLES = 100_000;
export const INLINE_RACES = 2_000;
/** Whole races one run may ask for. */
export const MAX_RACES = 1_000_000;
/** Coins a wager may be expected to pay before it is flagged (the designer's target). */
const TargetSchema = z.number().min(-1000).max(1000).default(0);

/** Whole races of the game: `{ "race": { "players": N }, "samples": N, "seed": S }`. */
export const RaceRequestSchema = z.object({
	race: z.object({ players: z.int().min(2).max(12) }),
	samples: z
		.int('samples must be a whole number')
		.min(1, 'samples must be at least 1')
		.max(MAX_RACES, `samples must be at most ${MAX_RACES.toLocaleString('en-GB')} races`),
	seed: z.int().min(0).max(0xffffffff).optional(),
	target: TargetSchema
});

const wagerLines = (prices: WagerPrice[]): WagerLine[] => prices.map((p) => ({ ...p }));

/** Stage wagers priced on a stage's odds (a stage says nothing of the race's end). */
function stageAnswer(game: Game, report: StageReport, target: number): StageAnswer {
	return { kind: 'stage', ...report, target, wagers: wagerLines(priceWagers(game, { stage: report.stage, target })) };
}

function raceAnswer(game: Game, players: number, samples: number, seed: number, odds: RaceOdds, target: number, ms?: number): RaceAnswer {
	const stage = placeOdds(odds.runners, odds.stage);
	const race = placeOdds(odds.runners, odds.final);
	return {
		kind: 'race',
		method: 'monte-carlo',
		samples,
		seed,
		players,
		stage,
		race,
		raceStandardErrors: placeOdds(odds.runners, odds.finalStandardErrors),
		stages: odds.stageCounts,
		meanStages: odds.meanStages,
		unfinished: odds.unfinished,
		target,
		wagers: wagerLines(priceWagers(game, { stage, race, target })),
		...(ms !== undefined ? { ms } : {})
	};
}

/** A request checked: a stage scenario or whole races, with the target. */
type Checked =
	| { kind: 'stage'; scenario: Scenario; method: z.infer<typeof OddsRequestSchema>['method']; target: number }
	| { kind: 'race'; players: number; samples: number; seed: number; target: number };

function check(body: unknown): Checked {
	const refuse = (issues: string[]) => {
		throw new ApiError(400, issues.join('; '), 'invalid', issues);
	};
	if (typeof body !== 'object' || body === null || Array.isArray(body)) refuse(['Send one JSON object']);
	const b = body as Record<string, unknown>;
	if ('race' in b) {
		const r = RaceRequestSchema.safeParse(b);
		if (!r.success) refuse(describeIssues(r.error));
		const d = r.data!;
		return { kind: 'race', players: d.race.players, samples: d.samples, seed: d.seed ?? DEFAULT_SEED, target: d.target };
	}
	const { target, ...rest } = b;
	const t = TargetSchema.safeParse(target);
	const r = OddsRequestSchema.safeParse(rest);
	if (!t.success || !r.success)
		refuse([...(t.success ? [] : t.error.issues.map((i) => `target: ${i.message}`)), ...(r.success ? [] : describeIssues(r.error))]);
	return { kind: 'stage', scenario: r.data!.scenario, method: r.data!.method, target: t.data! };
}

/**
 * Runs odds for a game. Small runs answer now (`{ answer }`); large ones start a job on the
 * worker pool and answer it (`{ job }`) to poll with `jobView`.
 */
export async function runOdds(db: Db, actor: OddsActor, body: unknown): Promise<{ answer: OddsAnswer } | { job: JobView }> {
	const req = check(body);
	const game = await loadGame(db, actor.gameId);
	if (req.kind === 'stage') {
		const { scenario, method, target } = req;
		if ('exact' in method || method.samples <= INLINE_SAMPLES) return { answer: stageAnswer(game, runStage(scenario, method), target) };
		const seed = method.seed ?? DEFAULT_SEED;
		const job = oddsJobs.start(actor, { kind: 'stage', scenario, samples: method.samples, seed }, (r) => {
			if (r.kind !== 'stage') throw new Error('a stage run answered with races');
			return stageAnswer(game, stageReport(r.odds, { samples: method.samples, seed }, { ms: r.ms }), target);
		});
		return { job };
	}
	let setup;
	try {
		setup = raceSetupFromGame(game, req.players);
	} catch (e) {
		if (e instanceof RaceSetupError) throw new ApiError(400, e.message);
		throw e;
	}
	if (req.samples <= INLINE_RACES) {
		const started = performance.now();
		const odds = simulateRaces(setup, req.samples, req.seed);
		return { answer: raceAnswer(game, req.players, req.samples, req.seed, odds, req.target, performance.now() - started) };
	}
	const job = oddsJobs.start(actor, { kind: 'race', setup, races: req.samples, seed: req.seed }, (r) => {
		if (r.kind !== 'race') throw new Error('a race run answered with a stage');
		return raceAnswer(game, req.players, req.samples, req.seed, r.odds, req.target, r.ms);
	});
	return { job };
}

/** Player counts with a setup card (the Odds tab offers these). */
export const playerCounts = (game: Game) => setupPlayerCounts(game);

/* ------------------------------------------------------------------- jobs */

/**
 * Where odds jobs run and wait. This in-process queue answers from the process's worker pool;
 * a shared queue (several app processes) can stand in behind the same three calls.
 */
export interface OddsJobQueue {
	start(owner: OddsActor, job: OddsJob, finish: (r: OddsJobResult) => OddsAnswer): JobView;
	view(userId: string, id: string): JobView;
	cancel(userId: string, id: string): JobView;
}

interface Held {
	view: JobView;
	userId: string;
	controller: AbortController;
	finishedAt?: number;
}

/** A finished job's answer stays this long to be read. */
const KEEP_MS = 10 * 60 * 1000;
/** Jobs one person may have waiting or running at once. */
const MAX_OPEN_PER_USER = 4;

class InProcessOddsJobs implements OddsJobQueue {
	private jobs = new Map<string, Held>();

	start(owner: OddsActor, job: OddsJob, finish: (r: OddsJobResult) => OddsAnswer): JobView {
		this.sweep();
		const open = [...this.jobs.values()].filter((j) => j.userId === owner.userId && !j.finishedAt).length;
		if (open >= MAX_OPEN_PER_USER) throw new ApiError(429, `You have ${open} odds runs going; wait for one or cancel it`);
		const total = job.kind === 'stage' ? job.samples : job.races;
		const held: Held = {
			view: { id: randomUUID(), state: 'queued', done: 0, total },
			userId: owner.userId,
			controller: new AbortController()
		};
		this.jobs.set(held.view.id, held);
		oddsPool()
			.run(job, {
				signal: held.controller.signal,
				onProgress: (done) => {
					held.view.state = 'running';
					held.view.done = done;
				}
			})
			.then((r) => {
				held.view.result = finish(r);
				held.view.state = 'done';
				held.view.done = total;
			})
			.catch((e) => {
				if (e instanceof OddsCancelled) held.view.state = 'cancelled';
				else {
					held.view.state = 'failed';
					held.view.error = 'The run failed';
					console.error(e);
				}
			})
			.finally(() => {
				held.finishedAt = Date.now();
			});
		return { ...held.view };
	}

	view(userId: string, id: string): JobView {
		return { ...this.find(userId, id).view };
	}

	cancel(userId: string, id: string): JobView {
		const held = this.find(userId, id);
		if (!held.finishedAt) held.controller.abort();
		return { ...held.view };
	}

	private find(userId: string, id: string): Held {
		const held = this.jobs.get(id);
		if (!held || held.userId !== userId) throw new ApiError(404, 'No such odds run (answers are kept for ten minutes)');
		return held;
	}

	private sweep() {
		const now = Date.now();
		for (const [id, j] of this.jobs) if (j.finishedAt && now - j.finishedAt > KEEP_MS) this.jobs.delete(id);
	}
}

export const oddsJobs: OddsJobQueue = new InProcessOddsJobs();

/* -------------------------------------------------------- saved scenarios */

export const SCENARIO_NAME_MAX = 80;
export const MAX_SAVED_SCENARIOS = 100;

export const SavedScenarioInputSchema = z.object({
	name: z.string().trim().min(1, 'Name the scenario').max(SCENARIO_NAME_MAX),
	scenario: ScenarioSchema,
	/** The answer of a run of this scenario, kept beside it. */
	lastResult: z.record(z.string(), z.unknown()).nullable().optional()
});
export type SavedScenarioInput = z.input<typeof SavedScenarioInputSchema>;

export interface SavedScenario {
	id: string;
	name: string;
	scenario: Scenario;
	lastResult: Record<string, unknown> | null;
	updatedAt: string;
}

const toSaved = (row: typeof oddsScenarios.$inferSelect): SavedScenario => ({
	id: row.id,
	name: row.name,
	scenario: ScenarioSchema.parse(row.scenario),
	lastResult: row.lastResult ?? null,
	updatedAt: row.updatedAt.toISOString()
});

export async function listScenarios(db: Db, actor: OddsActor): Promise<SavedScenario[]> {
	const rows = await db.select().from(oddsScenarios).where(eq(oddsScenarios.gameId, actor.gameId)).orderBy(asc(oddsScenarios.name));
	return rows.map(toSaved);
}

/** Saves a scenario under its name (a second save of the same name replaces it). */
export async function saveScenario(db: Db, actor: OddsActor, input: unknown): Promise<SavedScenario> {
	const parsed = SavedScenarioInputSchema.safeParse(input);
	if (!parsed.success) throw new ApiError(400, describeIssues(parsed.error).join('; '), 'invalid', describeIssues(parsed.error));
	const { name, scenario, lastResult } = parsed.data;
	return db.transaction(async (tx) => {
		const [{ n }] = await tx
			.select({ n: sql<number>`count(*)::int` })
			.from(oddsScenarios)
			.where(eq(oddsScenarios.gameId, actor.gameId));
		const [existing] = await tx
			.select()
			.from(oddsScenarios)
			.where(and(eq(oddsScenarios.gameId, actor.gameId), eq(oddsScenarios.name, name)));
		if (!existing && n >= MAX_SAVED_SCENARIOS) throw new ApiError(400, `A game keeps at most ${MAX_SAVED_SCENARIOS} scenarios`);
		const values = { scenario: scenario as unknown as Record<string, unknown>, lastResult: lastResult ?? null, updatedAt: new Date() };
		const [row] = existing
			? await tx.update(oddsScenarios).set(values).where(eq(oddsScenarios.id, existing.id)).returning()
			: await tx.insert(oddsScenarios).values({ gameId: actor.gameId, name, createdBy: actor.userId, ...values }).returning();
		await logActivity(tx as unknown as Db, {
			teamId: actor.teamId,
			gameId: actor.gameId,
			userId: actor.userId,
			action: 'odds.scenario',
			detail: { name }
		});
		return toSaved(row);
	});
}

/* ------------------------------------------------------------ proof prices */

/** Whole races a proof's wager prices come from, and their seed: fixed, so a proof's prices never change. */
export const PROOF_RACES = 20_000;
const PROOF_SEED = 1;

export interface ProofPrices {
	runners: { id: string; name: string; colourHex: string; symbol: Game['runners'][number]['symbol'] }[];
	players: number;
	races: number;
	meanStages: number;
	target: number;
	wagers: WagerLine[];
}

const proofPrices = new Map<string, Promise<ProofPrices | null>>();
const PROOF_PRICES_KEPT = 50;

/** The player count a proof is priced at: four when the game has a setup for four, else the nearest. */
function pricingPlayers(game: Game): number | undefined {
	const usable = setupPlayerCounts(game).filter((p) => {
		try {
			raceSetupFromGame(game, p);
			return true;
		} catch {
			return false;
		}
	});
	return usable.sort((a, b) => Math.abs(a - 4) - Math.abs(b - 4) || a - b)[0];
}

/**
 * Each wager card's expected coins as the proof's snapshot stood: whole races of the snapshot,
 * seeded, on the worker pool. Kept per proof (a snapshot never changes); null when the snapshot
 * has no usable setup card.
 */
export function pricesAtProof(proofId: string, snapshot: Game): Promise<ProofPrices | null> {
	const known = proofPrices.get(proofId);
	if (known) return known;
	const players = pricingPlayers(snapshot);
	const run: Promise<ProofPrices | null> =
		players === undefined
			? Promise.resolve(null)
			: oddsPool()
					.run({ kind: 'race', setup: raceSetupFromGame(snapshot, players), races: PROOF_RACES, seed: PROOF_SEED })
					.then((r) => {
						if (r.kind !== 'race') return null;
						const answer = raceAnswer(snapshot, players, PROOF_RACES, PROOF_SEED, r.odds, 0);
						const runners = snapshot.runners.map((x) => ({ id: x.id, name: x.name, colourHex: x.colourHex, symbol: x.symbol }));
						return { runners, players, races: PROOF_RACES, meanStages: answer.meanStages, target: 0, wagers: answer.wagers };
					});
	const kept = run.catch((e) => {
		proofPrices.delete(proofId);
		console.error(e);
		return null;
	});
	if (proofPrices.size >= PROOF_PRICES_KEPT) proofPrices.delete(proofPrices.keys().next().value!);
	proofPrices.set(proofId, kept);
	return kept;
}
