/**
 * The odds lab for the app: runs a stage scenario or whole races of a game, prices the game's
 * wager cards from the answer, keeps saved scenarios, and hands large runs to the worker pool as
 * jobs to poll (like print jobs): rows in the database that any app process runs and answers.
 * Small runs answer at once.
 */
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from './db';
import { oddsJobs, oddsScenarios } from './db/schema';
import { jobQueue } from './job-queue';
import { Invalid, NotFound, Refusal } from './refusals';
import { loadGame } from './game-store';
import { logActivity } from './activity';
import type { Game } from '$lib/game/model';
import { oddsPool, OddsCancelled, type OddsJob, type OddsJobResult } from '$lib/odds/parallel';
import { DEFAULT_SEED, OddsRequestSchema, runStage, stageReport, type StageReport } from '$lib/odds/report';
import { raceSetupFromGame, RaceSetupError, setupPlayerCounts, simulateRaces, type RaceOdds } from '$lib/odds/race';
import { MAX_SAMPLES, ScenarioSchema, describeIssues, type Scenario } from '$lib/odds/scenario';
import { placeOdds, priceWagers, type WagerPrice } from '$lib/odds/wagers';
import type { JobView, OddsAnswer, RaceAnswer, StageAnswer, WagerLine } from '$lib/odds/answer';
import type { Actor, GameActor } from './actor';

export type { JobView, OddsAnswer };


/** Runs up to these sizes answer at once; larger ones become jobs. */
export const INLINE_SAMPLES = 100_000;
export const INLINE_RACES = 2_000;
/** Whole races one run may ask for. */
export const MAX_RACES = 1_000_000;
/** Coins a wager may be expected to pay before it is flagged (the designer's target). */
const TargetSchema = z.number().min(-1000).max(1000).default(0);

/** Whole races of the game: `{ "race": { "players": N }, "samples": N, "seed": S }`. */
export const RaceRequestSchema = z.strictObject({
	race: z.strictObject({ players: z.int().min(2).max(12) }),
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
		throw new Invalid(issues.join('; '), issues, 'invalid');
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
export async function runOdds(db: Db, actor: GameActor, body: unknown): Promise<{ answer: OddsAnswer } | { job: JobView }> {
	const req = check(body);
	const game = await loadGame(db, actor.gameId);
	if (req.kind === 'stage') {
		const { scenario, method, target } = req;
		if ('exact' in method || method.samples <= INLINE_SAMPLES) return { answer: stageAnswer(game, runStage(scenario, method), target) };
		const seed = method.seed ?? DEFAULT_SEED;
		return { job: await startOddsJob(db, actor, { kind: 'stage', game, target, scenario, samples: method.samples, seed }) };
	}
	let setup;
	try {
		setup = raceSetupFromGame(game, req.players);
	} catch (e) {
		if (e instanceof RaceSetupError) throw new Invalid(e.message);
		throw e;
	}
	if (req.samples <= INLINE_RACES) {
		const started = performance.now();
		const odds = simulateRaces(setup, req.samples, req.seed);
		return { answer: raceAnswer(game, req.players, req.samples, req.seed, odds, req.target, performance.now() - started) };
	}
	return {
		job: await startOddsJob(db, actor, { kind: 'race', game, target: req.target, players: req.players, races: req.samples, seed: req.seed })
	};
}

/** Player counts with a setup card (the Odds tab offers these). */
export const playerCounts = (game: Game) => setupPlayerCounts(game);

/* ------------------------------------------------------------------- jobs */

/**
 * A large run as a database row, run through the job queue (./job-queue.ts): in this process
 * with PGlite, by any process's workers with a PostgreSQL server. The row holds what was fixed
 * when it was queued (the game as data and the checked request), so a retry elsewhere after a
 * crash computes the same answer; its progress, its answer, and a cancel from any process.
 * Finished rows are kept ten minutes (./job-sweep.ts).
 */
type QueuedOdds = { game: Game; target: number } & (
	| { kind: 'stage'; scenario: Scenario; samples: number; seed: number }
	| { kind: 'race'; players: number; races: number; seed: number }
);

/** Jobs one person may have waiting or running at once. */
const MAX_OPEN_PER_USER = 4;
/** Progress is written, and a cancel looked for, at most this often. */
const PROGRESS_MS = 400;
const OPEN = ['queued', 'running'] as const;

type OddsJobRow = typeof oddsJobs.$inferSelect;

function viewOf(row: OddsJobRow): JobView {
	return {
		id: row.id,
		state: row.state,
		done: row.done,
		total: row.total,
		...(row.error ? { error: row.error } : {}),
		...(row.result ? { result: row.result as unknown as OddsAnswer } : {})
	};
}

async function startOddsJob(db: Db, owner: GameActor, request: QueuedOdds): Promise<JobView> {
	const [{ open }] = await db
		.select({ open: sql<number>`count(*)::int` })
		.from(oddsJobs)
		.where(and(eq(oddsJobs.userId, owner.userId), inArray(oddsJobs.state, OPEN)));
	if (open >= MAX_OPEN_PER_USER) throw new Refusal('too-many', `You have ${open} odds runs going; wait for one or cancel it`);
	const total = request.kind === 'stage' ? request.samples : request.races;
	const [row] = await db
		.insert(oddsJobs)
		.values({ userId: owner.userId, gameId: owner.gameId, total, request: request as unknown as Record<string, unknown> })
		.returning();
	await jobQueue().send('odds', row.id);
	return viewOf(row);
}

async function findOddsJob(db: Db, userId: string, id: string): Promise<OddsJobRow> {
	const [row] = await db
		.select()
		.from(oddsJobs)
		.where(and(eq(oddsJobs.id, id), eq(oddsJobs.userId, userId)));
	if (!row) throw new NotFound('No such odds run (answers are kept for ten minutes)');
	return row;
}

/** A run's progress, then its answer. Only the person who started it sees it. */
export async function oddsJobView(db: Db, userId: string, id: string): Promise<JobView> {
	return viewOf(await findOddsJob(db, userId, id));
}

/** Runs this process is computing, to stop at once on a cancel made here or on shutdown. */
const runningHere = new Map<string, { controller: AbortController; stopping: boolean }>();

/** A run stopped with its process (not cancelled by its owner). */
class OddsRunStopped extends Error {}

/** Cancels a run, whichever process is computing it (that one notices within a moment). */
export async function cancelOddsJob(db: Db, actor: Actor, { id }: { id: string }): Promise<JobView> {
	const { userId } = actor;
	await findOddsJob(db, userId, id);
	await db
		.update(oddsJobs)
		.set({ state: 'cancelled', finishedAt: new Date() })
		.where(and(eq(oddsJobs.id, id), eq(oddsJobs.userId, userId), inArray(oddsJobs.state, OPEN)));
	runningHere.get(id)?.controller.abort();
	return oddsJobView(db, userId, id);
}

/**
 * Computes one queued run (the queue's worker calls this, in whichever process took it).
 * Returns when the run is answered, was cancelled or was answered by another attempt; throws
 * when it should be tried again.
 */
export async function runQueuedOddsJob(db: Db, id: string): Promise<void> {
	const [row] = await db
		.update(oddsJobs)
		.set({ attempts: sql`${oddsJobs.attempts} + 1` })
		.where(and(eq(oddsJobs.id, id), inArray(oddsJobs.state, OPEN)))
		.returning();
	if (!row) return;
	// Which process runs what, for operators following a shared queue.
	if (jobQueue().shared) console.log(`Running odds job ${id} (attempt ${row.attempts}) in process ${process.pid}`);
	const req = row.request as unknown as QueuedOdds;
	const job: OddsJob =
		req.kind === 'stage'
			? { kind: 'stage', scenario: req.scenario, samples: req.samples, seed: req.seed }
			: { kind: 'race', setup: raceSetupFromGame(req.game, req.players), races: req.races, seed: req.seed };
	const here = { controller: new AbortController(), stopping: false };
	runningHere.set(id, here);
	// Progress goes to the row; a row no longer open means a cancel, made in any process.
	let last = 0;
	let writing = Promise.resolve();
	const report = (done: number) => {
		writing = writing
			.then(async () => {
				const open = await db
					.update(oddsJobs)
					.set({ state: 'running', done })
					.where(and(eq(oddsJobs.id, id), inArray(oddsJobs.state, OPEN)))
					.returning({ id: oddsJobs.id });
				if (!open.length) here.controller.abort();
			})
			.catch(() => undefined);
	};
	// Between progress reports (or while waiting its turn on the pool), look for a cancel.
	const watch = setInterval(() => {
		if (Date.now() - last < PROGRESS_MS) return;
		writing = writing
			.then(async () => {
				const [now] = await db.select({ state: oddsJobs.state }).from(oddsJobs).where(eq(oddsJobs.id, id));
				if (!now || !(OPEN as readonly string[]).includes(now.state)) here.controller.abort();
			})
			.catch(() => undefined);
	}, PROGRESS_MS * 2);
	watch.unref();
	try {
		const r = await oddsPool().run(job, {
			signal: here.controller.signal,
			onProgress: (done) => {
				row.done = done;
				if (Date.now() - last < PROGRESS_MS) return;
				last = Date.now();
				report(done);
			}
		});
		const answer = answerOf(req, r);
		clearInterval(watch);
		await writing;
		await db
			.update(oddsJobs)
			.set({ state: 'done', done: row.total, result: answer as unknown as Record<string, unknown>, finishedAt: new Date() })
			.where(and(eq(oddsJobs.id, id), inArray(oddsJobs.state, OPEN)));
	} catch (e) {
		clearInterval(watch);
		await writing;
		// Cancelled by its owner: the row says so already. Stopped with the process: run elsewhere
		// (a shared queue), or closed with a word to run it again (this process was the only one).
		if (e instanceof OddsCancelled) {
			if (!here.stopping) return;
			throw new OddsRunStopped('The server stopped during the run; run it again');
		}
		throw e;
	} finally {
		clearInterval(watch);
		runningHere.delete(id);
	}
}

function answerOf(req: QueuedOdds, r: OddsJobResult): OddsAnswer {
	if (req.kind === 'stage') {
		if (r.kind !== 'stage') throw new Error('a stage run answered with races');
		return stageAnswer(req.game, stageReport(r.odds, { samples: req.samples, seed: req.seed }, { ms: r.ms }), req.target);
	}
	if (r.kind !== 'race') throw new Error('a race run answered with a stage');
	return raceAnswer(req.game, req.players, req.races, req.seed, r.odds, req.target, r.ms);
}

/** Gives up on a run after its last attempt. */
export async function failOddsJob(db: Db, id: string, error: unknown) {
	if (!(error instanceof OddsRunStopped)) console.error(error);
	await db
		.update(oddsJobs)
		.set({ state: 'failed', error: error instanceof OddsRunStopped ? error.message : 'The run failed', finishedAt: new Date() })
		.where(and(eq(oddsJobs.id, id), inArray(oddsJobs.state, OPEN)));
}

/**
 * On shutdown: stops the runs this process is computing, which can be long. With a shared
 * queue they are taken up again by another process at once rather than after they expire.
 */
export function stopOddsRunsHere() {
	for (const here of runningHere.values()) {
		here.stopping = true;
		here.controller.abort();
	}
}

/* -------------------------------------------------------- saved scenarios */

export const SCENARIO_NAME_MAX = 80;
export const MAX_SAVED_SCENARIOS = 100;

export const SavedScenarioInputSchema = z.strictObject({
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

export async function listScenarios(db: Db, actor: GameActor): Promise<SavedScenario[]> {
	const rows = await db.select().from(oddsScenarios).where(eq(oddsScenarios.gameId, actor.gameId)).orderBy(asc(oddsScenarios.name));
	return rows.map(toSaved);
}

/** Saves a scenario under its name (a second save of the same name replaces it). */
export async function saveScenario(db: Db, actor: GameActor, input: unknown): Promise<SavedScenario> {
	const parsed = SavedScenarioInputSchema.safeParse(input);
	if (!parsed.success) throw new Invalid(describeIssues(parsed.error).join('; '), describeIssues(parsed.error), 'invalid');
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
		if (!existing && n >= MAX_SAVED_SCENARIOS) throw new Invalid(`A game keeps at most ${MAX_SAVED_SCENARIOS} scenarios`);
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
