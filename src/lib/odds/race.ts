/**
 * Whole races from a game's own data, played at random: a model of random play, not of good play.
 *
 * Each stage the movement deck is shuffled and dealt by the setup card for the chosen player
 * count; the shared deck (cards to the shared deck + extra cards, plus `rogueToDeck` rogue cards
 * when the rogue cards are kept apart) is drawn to the end, and each face-up card is played
 * before a uniformly random draw of that stage. Hands and discards leave the stage unplayed.
 * Positions carry from stage to stage; modifiers (if any are given) are laid afresh each stage.
 *
 * The track: the setup card's number of tiles, start tile first, then the normal tiles in number
 * order, then the finish tile, front sides up; spaces are numbered 1.. along it. Ranked runners
 * start behind the start (space 0, unstacked); the rogue starts on the last space; a ranked
 * runner passing the last space (reaching `finish` = spaces + 1) ends the race.
 */
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import type { JumpableRandomGenerator } from 'pure-rand/types/JumpableRandomGenerator';
import { DEFAULT_RACE_RULES, type Game, type RaceRules, type SetupData } from '../game/model';
import { copyState, newState, newTrack, playCard, rankInto, SHARE_UNITS, tallyOrder, type Track } from './movement';
import { chunkCount, chunkGenerator, chunkSize } from './stage';

/** Everything a whole race needs, in plain data (what the workers receive). */
export interface RaceSetup {
	players: number;
	/** Ranked runner ids, then the rogue's id when there is one. */
	runners: string[];
	rogue?: string;
	finish: number;
	rules: RaceRules;
	/** The movement deck dealt each stage: runner index and steps per card (copies expanded). */
	deckRunner: number[];
	deckSteps: number[];
	/** Rogue cards kept apart (steps per card); `rogueToDeck` of them join each shared deck. */
	rogueSteps: number[];
	rogueToDeck: number;
	/** Cards dealt to the shared deck, and face-up cards, per stage. */
	sharedCards: number;
	faceUpCards: number;
	modifiers: { space: number; steps: number }[];
	/** A race still running after this many stages counts as unfinished. */
	maxStages: number;
}

export class RaceSetupError extends Error {
	readonly status = 400;
	constructor(message: string) {
		super(message);
		this.name = 'RaceSetupError';
	}
}

export const DEFAULT_MAX_STAGES = 60;

/** Player counts the game has a setup card for. */
export function setupPlayerCounts(game: Game): number[] {
	return game.cards
		.flatMap((c) => (c.data.type === 'setup' ? [c.data.players] : []))
		.sort((a, b) => a - b);
}

export function raceSetupFromGame(
	game: Game,
	players: number,
	options: { modifiers?: { space: number; steps: number }[]; maxStages?: number } = {}
): RaceSetup {
	const setupCard = game.cards.find((c) => c.data.type === 'setup' && c.data.players === players);
	if (!setupCard) throw new RaceSetupError(`The game has no setup card for ${players} players`);
	const setup = setupCard.data as SetupData;
	const ranked = [...game.runners].sort((a, b) => a.sortOrder - b.sortOrder).map((r) => r.id);
	if (!ranked.length) throw new RaceSetupError('The game has no runners');
	const rogue = game.rogueRunner?.id;
	const index = new Map(ranked.map((id, i) => [id, i]));
	const rogueIndex = ranked.length;
	const rogueToDeck = setup.rogueToDeck ?? 0;

	const deckRunner: number[] = [];
	const deckSteps: number[] = [];
	const rogueSteps: number[] = [];
	for (const card of game.cards) {
		const d = card.data;
		for (let k = 0; k < card.copies; k++) {
			if (d.type === 'movement' && index.has(d.runnerId)) {
				deckRunner.push(index.get(d.runnerId)!);
				deckSteps.push(d.steps);
			} else if (d.type === 'rogue' && rogue) {
				if (rogueToDeck > 0) rogueSteps.push(d.steps);
				else {
					deckRunner.push(rogueIndex);
					deckSteps.push(d.steps);
				}
			}
		}
	}
	const sharedCards = setup.toSharedDeck + setup.extraFromDeck;
	const needed = players * setup.handSize + setup.discards + setup.toSharedDeck + setup.faceUp + setup.extraFromDeck;
	if (needed > deckRunner.length)
		throw new RaceSetupError(
			`The deal for ${players} players needs ${needed} movement cards but the deck has ${deckRunner.length}`
		);
	if (rogueToDeck > rogueSteps.length)
		throw new RaceSetupError(`The setup adds ${rogueToDeck} rogue cards to the shared deck but the game has ${rogueSteps.length}`);
	if (sharedCards + rogueToDeck === 0) throw new RaceSetupError(`The shared deck for ${players} players is empty`);

	const tiles = game.cards.flatMap((c) => (c.data.type === 'tile' ? Array(c.copies).fill(c.data) : []));
	const start = tiles.filter((t) => t.role === 'start').sort((a, b) => a.number - b.number)[0];
	const finishTile = tiles.filter((t) => t.role === 'finish').sort((a, b) => a.number - b.number)[0];
	const normal = tiles.filter((t) => t.role === 'normal').sort((a, b) => a.number - b.number);
	if (!start || !finishTile) throw new RaceSetupError('The track needs a start tile and a finish tile');
	if (setup.trackLength - 2 > normal.length)
		throw new RaceSetupError(`The track is ${setup.trackLength} tiles long but the game has ${normal.length + 2}`);
	const laid = [start, ...normal.slice(0, setup.trackLength - 2), finishTile];
	const spaces = laid.reduce((n, t) => n + t.spacesFront, 0);
	if (spaces < 1) throw new RaceSetupError('The track has no spaces');

	return {
		players,
		runners: rogue ? [...ranked, rogue] : ranked,
		rogue,
		finish: spaces + 1,
		rules: game.raceRules ?? DEFAULT_RACE_RULES,
		deckRunner,
		deckSteps,
		rogueSteps,
		rogueToDeck,
		sharedCards,
		faceUpCards: setup.faceUp,
		modifiers: options.modifiers ?? [],
		maxStages: options.maxStages ?? DEFAULT_MAX_STAGES
	};
}

/** Sums over races, exact integers like the stage tally (see ./stage.ts). */
export interface RaceTally {
	races: number;
	/** Place shares at race end, ranked × ranked, and their squares. */
	final: Float64Array;
	finalSquares: Float64Array;
	/** Place shares at every stage end, summed over stages (a stage wager's odds in a random stage). */
	stageEnds: Float64Array;
	stagesPlayed: number;
	/** stageCounts[k]: races that lasted k stages (index maxStages + 1: unfinished). */
	stageCounts: Float64Array;
}

export function emptyRaceTally(setup: RaceSetup): RaceTally {
	const R = setup.runners.length - (setup.rogue ? 1 : 0);
	return {
		races: 0,
		final: new Float64Array(R * R),
		finalSquares: new Float64Array(R * R),
		stageEnds: new Float64Array(R * R),
		stagesPlayed: 0,
		stageCounts: new Float64Array(setup.maxStages + 2)
	};
}

export function addRaceTally(into: RaceTally, from: RaceTally): void {
	into.races += from.races;
	into.stagesPlayed += from.stagesPlayed;
	for (let i = 0; i < into.final.length; i++) {
		into.final[i] += from.final[i];
		into.finalSquares[i] += from.finalSquares[i];
		into.stageEnds[i] += from.stageEnds[i];
	}
	for (let i = 0; i < into.stageCounts.length; i++) into.stageCounts[i] += from.stageCounts[i];
}

/** A compiled race: the track and scratch arrays, built once per thread. */
export interface RaceRunner {
	setup: RaceSetup;
	track: Track;
	run(rng: JumpableRandomGenerator, races: number, tally: RaceTally): void;
}

export function compileRace(setup: RaceSetup): RaceRunner {
	const R = setup.runners.length - (setup.rogue ? 1 : 0);
	const track = newTrack(setup.runners.length, R, setup.finish, setup.rules, setup.modifiers);
	const start = newState(track);
	if (setup.rogue) start.pos[R] = setup.finish - 1;
	const s = newState(track);
	const deckRunner = Int8Array.from(setup.deckRunner);
	const deckSteps = Int8Array.from(setup.deckSteps);
	const rogueSteps = Int8Array.from(setup.rogueSteps);
	const n = deckRunner.length;
	const shared = Math.min(setup.sharedCards, n);
	const faceUp = Math.min(setup.faceUpCards, n - shared);
	const rogueCount = Math.min(setup.rogueToDeck, rogueSteps.length);
	const draws = shared + rogueCount;
	// The shared deck of one stage: runner and steps per card, then each face-up card's slot.
	const stageRunner = new Int8Array(draws);
	const stageSteps = new Int8Array(draws);
	const faceUpSlot = new Int32Array(faceUp);
	const order = new Int8Array(R);

	const run = (rng: JumpableRandomGenerator, races: number, tally: RaceTally) => {
		for (let race = 0; race < races; race++) {
			copyState(start, s);
			let stage = 0;
			while (!s.over && stage < setup.maxStages) {
				stage++;
				s.spent = 0;
				// Deal: the first shared + faceUp cards of a fresh shuffle (partial Fisher–Yates).
				for (let k = 0; k < shared + faceUp; k++) {
					const j = k + uniformInt(rng, 0, n - 1 - k);
					const r = deckRunner[j];
					const st = deckSteps[j];
					deckRunner[j] = deckRunner[k];
					deckSteps[j] = deckSteps[k];
					deckRunner[k] = r;
					deckSteps[k] = st;
				}
				for (let k = 0; k < shared; k++) {
					stageRunner[k] = deckRunner[k];
					stageSteps[k] = deckSteps[k];
				}
				for (let k = 0; k < rogueCount; k++) {
					const j = k + uniformInt(rng, 0, rogueSteps.length - 1 - k);
					const st = rogueSteps[j];
					rogueSteps[j] = rogueSteps[k];
					rogueSteps[k] = st;
					stageRunner[shared + k] = R;
					stageSteps[shared + k] = st;
				}
				// The shared deck's order, then a random moment (before one of its draws) per face-up card.
				for (let k = 0; k < draws - 1; k++) {
					const j = k + uniformInt(rng, 0, draws - 1 - k);
					const r = stageRunner[j];
					const st = stageSteps[j];
					stageRunner[j] = stageRunner[k];
					stageSteps[j] = stageSteps[k];
					stageRunner[k] = r;
					stageSteps[k] = st;
				}
				for (let f = 0; f < faceUp; f++) faceUpSlot[f] = uniformInt(rng, 0, draws - 1);
				for (let k = 0; k < draws && !s.over; k++) {
					for (let f = 0; f < faceUp && !s.over; f++)
						if (faceUpSlot[f] === k) playCard(track, s, deckRunner[shared + f], deckSteps[shared + f]);
					if (!s.over) playCard(track, s, stageRunner[k], stageSteps[k]);
				}
				const behind = rankInto(track, s, order);
				tallyOrder(R, order, behind, tally.stageEnds, 1);
			}
			tally.stagesPlayed += stage;
			tally.stageCounts[s.over ? stage : setup.maxStages + 1]++;
			const behind = rankInto(track, s, order);
			tallyOrder(R, order, behind, tally.final, 1, tally.finalSquares);
		}
		tally.races += races;
	};
	return { setup, track, run };
}

export interface RaceOdds {
	runners: string[];
	races: number;
	/** Place probabilities at race end and their standard errors (row = runner, column = place). */
	final: number[][];
	finalStandardErrors: number[][];
	/** Place probabilities at the end of a stage, over all stages played. */
	stage: number[][];
	/** P(race lasts k stages) for k = 1..; `unfinished`: still running after maxStages. */
	stageCounts: { stages: number; probability: number }[];
	unfinished: number;
	meanStages: number;
}

export function raceOddsFromTally(setup: RaceSetup, t: RaceTally): RaceOdds {
	const R = setup.runners.length - (setup.rogue ? 1 : 0);
	const n = t.races;
	const grid = (f: (i: number) => number) => Array.from({ length: R }, (_, r) => Array.from({ length: R }, (_, p) => f(r * R + p)));
	const stageCounts: RaceOdds['stageCounts'] = [];
	for (let k = 1; k <= setup.maxStages; k++) if (t.stageCounts[k] > 0) stageCounts.push({ stages: k, probability: t.stageCounts[k] / n });
	return {
		runners: setup.runners.slice(0, R),
		races: n,
		final: grid((i) => t.final[i] / SHARE_UNITS / n),
		finalStandardErrors: grid((i) => {
			if (n < 2) return 0;
			const m = t.final[i] / SHARE_UNITS / n;
			const m2 = t.finalSquares[i] / (SHARE_UNITS * SHARE_UNITS) / n;
			return Math.sqrt(Math.max(0, (m2 - m * m) * (n / (n - 1))) / n);
		}),
		stage: grid((i) => (t.stagesPlayed ? t.stageEnds[i] / SHARE_UNITS / t.stagesPlayed : 0)),
		stageCounts,
		unfinished: t.stageCounts[setup.maxStages + 1] / n,
		meanStages: t.stagesPlayed / n
	};
}

/** Whole races on this thread, chunked and seeded like the stage samples (./parallel.ts spreads them). */
export function simulateRaces(setup: RaceSetup, races: number, seed: number): RaceOdds {
	const runner = compileRace(setup);
	const tally = emptyRaceTally(setup);
	for (let k = 0; k < chunkCount(races); k++) runner.run(chunkGenerator(seed, k), chunkSize(races, k), tally);
	return raceOddsFromTally(setup, tally);
}
