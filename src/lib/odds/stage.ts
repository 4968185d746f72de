/**
 * Stage odds for a scenario: exact (every order of the deck, memoised) or Monte Carlo (seeded
 * samples). Both fill the same tally: for each ranked runner, the chance of each place when the
 * stage ends (its deck runs out, or the race ends first).
 */
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import type { JumpableRandomGenerator } from 'pure-rand/types/JumpableRandomGenerator';
import { copyState, newState, newTrack, playCard, rankInto, SHARE_UNITS, tallyOrder, type RaceState, type Track } from './movement';
import { EXACT_MAX_CARDS, exactLimitMessage, rankedRunners, type Scenario } from './scenario';

/** A scenario turned into indices: runners 0..ranked-1 ranked, the rogue last. */
export interface CompiledStage {
	track: Track;
	start: RaceState;
	/** Runner ids by index. */
	names: string[];
	/** Distinct cards: runner index and steps; `counts[t]` copies of each. */
	cardRunner: Int8Array;
	cardSteps: Int8Array;
	counts: Int32Array;
	/** The deck as card-type indices, one entry per card. */
	deck: Int8Array;
}

export function compileStage(s: Scenario): CompiledStage {
	const ranked = rankedRunners(s);
	const names = s.rogue ? [...ranked, s.rogue.runner] : ranked;
	const index = new Map(names.map((n, i) => [n, i]));
	const track = newTrack(names.length, ranked.length, s.finish, s.rules, s.modifiers);
	const start = newState(track);
	for (const stack of s.stacks)
		stack.bottomToTop.forEach((runner, h) => {
			const i = index.get(runner)!;
			start.pos[i] = stack.space;
			start.height[i] = stack.space === 0 ? 0 : h;
		});
	const types = new Map<string, number>();
	const cardRunner: number[] = [];
	const cardSteps: number[] = [];
	const counts: number[] = [];
	const deck = new Int8Array(s.deck.length);
	s.deck.forEach((card, i) => {
		const key = `${card.runner}\u0000${card.steps}`;
		let t = types.get(key);
		if (t === undefined) {
			t = cardRunner.length;
			types.set(key, t);
			cardRunner.push(index.get(card.runner)!);
			cardSteps.push(card.steps);
			counts.push(0);
		}
		counts[t]++;
		deck[i] = t;
	});
	return {
		track,
		start,
		names,
		cardRunner: Int8Array.from(cardRunner),
		cardSteps: Int8Array.from(cardSteps),
		counts: Int32Array.from(counts),
		deck
	};
}

/** Place probabilities (row = ranked runner, column = place) and the chance the race ends this stage. */
export interface StageOdds {
	runners: string[];
	places: number[][];
	/** Standard error beside each probability (Monte Carlo only). */
	standardErrors?: number[][];
	raceEnds: number;
	raceEndsStandardError?: number;
}

/* ------------------------------------------------------------------- exact */

export class ExactLimitError extends Error {
	readonly status = 400;
	constructor(cards: number) {
		super(exactLimitMessage(cards));
		this.name = 'ExactLimitError';
	}
}

/**
 * Every order of the remaining deck, equally likely. Orders that reach the same positions with
 * the same cards left share one answer (memoised on state + remaining multiset), so equal cards
 * and moves that commute are not enumerated twice.
 */
export function exactStage(c: CompiledStage): StageOdds & { nodes: number } {
	const cards = c.deck.length;
	if (cards > EXACT_MAX_CARDS) throw new ExactLimitError(cards);
	const { track } = c;
	const R = track.ranked;
	const width = R * R + 1; // places tally, then "race over"
	const types = c.counts.length;
	const counts = Int32Array.from(c.counts);
	const states: RaceState[] = Array.from({ length: cards + 1 }, () => newState(track));
	copyState(c.start, states[0]);
	const order = new Int8Array(R);
	const memo = new Map<string, Float64Array>();
	const keyCodes = new Uint16Array(track.runners * 2 + 2 + types);

	const leaf = (s: RaceState): Float64Array => {
		const out = new Float64Array(width);
		const behind = rankInto(track, s, order);
		tallyOrder(R, order, behind, out, 1 / SHARE_UNITS);
		out[R * R] = s.over ? 1 : 0;
		return out;
	};

	const solve = (depth: number, left: number): Float64Array => {
		const s = states[depth];
		if (s.over || left === 0) return leaf(s);
		let k = 0;
		for (let i = 0; i < track.runners; i++) {
			keyCodes[k++] = s.pos[i];
			keyCodes[k++] = s.height[i];
		}
		keyCodes[k++] = s.spent & 0xffff;
		keyCodes[k++] = s.spent >>> 16;
		for (let t = 0; t < types; t++) keyCodes[k++] = counts[t];
		const key = String.fromCharCode.apply(null, keyCodes as unknown as number[]);
		const known = memo.get(key);
		if (known) return known;
		const acc = new Float64Array(width);
		const next = states[depth + 1];
		for (let t = 0; t < types; t++) {
			if (counts[t] === 0) continue;
			const w = counts[t] / left;
			copyState(s, next);
			playCard(track, next, c.cardRunner[t], c.cardSteps[t]);
			counts[t]--;
			const sub = solve(depth + 1, left - 1);
			counts[t]++;
			for (let i = 0; i < width; i++) acc[i] += w * sub[i];
		}
		memo.set(key, acc);
		return acc;
	};

	const result = solve(0, cards);
	return {
		runners: c.names.slice(0, R),
		places: rows(R, (r, p) => result[r * R + p]),
		raceEnds: result[R * R],
		nodes: memo.size
	};
}

/* ------------------------------------------------------------- monte carlo */

/**
 * Sums over samples, kept as exact integers (ties in units of SHARE_UNITS) so that chunks can
 * be added in any order, on any thread, and give the very same answer.
 */
export interface Tally {
	samples: number;
	/** ranked × ranked: Σ share, Σ share² (share in SHARE_UNITS). */
	places: Float64Array;
	squares: Float64Array;
	raceEnds: number;
}

export function emptyTally(ranked: number): Tally {
	return { samples: 0, places: new Float64Array(ranked * ranked), squares: new Float64Array(ranked * ranked), raceEnds: 0 };
}

export function addTally(into: Tally, from: Tally): void {
	into.samples += from.samples;
	into.raceEnds += from.raceEnds;
	for (let i = 0; i < into.places.length; i++) {
		into.places[i] += from.places[i];
		into.squares[i] += from.squares[i];
	}
}

/**
 * Samples come in chunks of this size; chunk k draws from the seed's generator jumped k times
 * (2^64 steps each), so the answer depends on the seed and the sample count only, never on how
 * many threads shared the work.
 */
export const CHUNK_SAMPLES = 1 << 16;

export function chunkGenerator(seed: number, chunk: number): JumpableRandomGenerator {
	const rng = xoroshiro128plus(seed);
	for (let k = 0; k < chunk; k++) rng.jump();
	return rng;
}

export function chunkCount(samples: number): number {
	return Math.ceil(samples / CHUNK_SAMPLES);
}

export function chunkSize(samples: number, chunk: number): number {
	return Math.min(CHUNK_SAMPLES, samples - chunk * CHUNK_SAMPLES);
}

/** Plays `samples` random orders of the deck from the start, adding them to `tally`. */
export function sampleStage(c: CompiledStage, rng: JumpableRandomGenerator, samples: number, tally: Tally): void {
	const { track } = c;
	const R = track.ranked;
	const s = newState(track);
	const deck = Int8Array.from(c.deck);
	const n = deck.length;
	const order = new Int8Array(R);
	for (let i = 0; i < samples; i++) {
		copyState(c.start, s);
		// Draw the deck one card at a time (Fisher–Yates, stopping when the race ends).
		for (let k = 0; k < n; k++) {
			const j = k + uniformInt(rng, 0, n - 1 - k);
			const t = deck[j];
			deck[j] = deck[k];
			deck[k] = t;
			if (playCard(track, s, c.cardRunner[t], c.cardSteps[t])) break;
		}
		const behind = rankInto(track, s, order);
		tallyOrder(R, order, behind, tally.places, 1, tally.squares);
		if (s.over) tally.raceEnds++;
	}
	tally.samples += samples;
}

/** Probabilities and standard errors from a tally (sample variance of each place's share). */
export function stageOddsFromTally(runners: string[], t: Tally): StageOdds {
	const R = runners.length;
	const n = t.samples;
	const p = (i: number) => t.places[i] / SHARE_UNITS / n;
	const se = (i: number) => {
		if (n < 2) return 0;
		const mean = p(i);
		const meanSq = t.squares[i] / (SHARE_UNITS * SHARE_UNITS) / n;
		return Math.sqrt(Math.max(0, (meanSq - mean * mean) * (n / (n - 1))) / n);
	};
	const end = t.raceEnds / n;
	return {
		runners,
		places: rows(R, (r, q) => p(r * R + q)),
		standardErrors: rows(R, (r, q) => se(r * R + q)),
		raceEnds: end,
		raceEndsStandardError: n < 2 ? 0 : Math.sqrt((end * (1 - end)) / (n - 1))
	};
}

/** Monte Carlo on this thread (the CLI's fallback, the tests; ./parallel.ts spreads the chunks). */
export function monteCarloStage(c: CompiledStage, samples: number, seed: number): StageOdds {
	const tally = emptyTally(c.track.ranked);
	for (let k = 0; k < chunkCount(samples); k++) sampleStage(c, chunkGenerator(seed, k), chunkSize(samples, k), tally);
	return stageOddsFromTally(c.names.slice(0, c.track.ranked), tally);
}

function rows(n: number, at: (r: number, p: number) => number): number[][] {
	return Array.from({ length: n }, (_, r) => Array.from({ length: n }, (_, p) => at(r, p)));
}
