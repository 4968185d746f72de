/**
 * How the demo's money tables are priced with the odds lab: the runs whose figures stand beside
 * the tables in ./demo, shared by the pricing script (`npm run odds:demo`), the test that keeps
 * the tables inside their targets, and the demo seed (its saved scenarios).
 *
 * Stage tables. A bettor at the start of a stage sees where the snails stand, not the shared deck.
 * So for each of the demo's start-of-stage positions the lab plays the stage on many seeded deals
 * from the setup card (Monte Carlo over the order of each deal, face-up cards shuffled in among
 * the shared deck's cards), and the deals are averaged. A table's price is the expected coins of
 * its card on the snail that leads when the stage starts, averaged over the positions.
 *
 * Race-end tables. Whole races from the setup card (every snail starts off the track, so every
 * snail has the same chances); a race card's price is its expected coins when taken at the start.
 */
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import type { RandomGenerator } from 'pure-rand/types/RandomGenerator';
import { coinsForPlace, type BetType, type Game, type MoneyTable } from '../game/model';
import { raceSetupFromGame, setupPlayerCounts, simulateRaces, type RaceOdds, type RaceSetup } from '../odds/race';
import { ScenarioSchema, type ScenarioInput } from '../odds/scenario';
import { compileStage, monteCarloStage } from '../odds/stage';
import { expectedCoins } from '../odds/wagers';
import { DEMO_PRICING_PLAYERS, DEMO_STAGE_POSITIONS, DEMO_TABLE_TARGETS, demoGame, type StagePosition } from './demo';

/** The cards one stage plays: the shared deck and the face-up cards, then the rogue's cards. */
export function dealStage(setup: RaceSetup, rng: RandomGenerator): { runner: string; steps: number }[] {
	const n = setup.deckRunner.length;
	const order = Array.from({ length: n }, (_, i) => i);
	const take = Math.min(n, setup.sharedCards + setup.faceUpCards);
	// Partial Fisher–Yates: the first `take` places hold a uniformly random deal.
	for (let k = 0; k < take; k++) {
		const j = k + uniformInt(rng, 0, n - 1 - k);
		[order[k], order[j]] = [order[j], order[k]];
	}
	const rogue = [...setup.rogueSteps];
	for (let k = 0; k < setup.rogueToDeck; k++) {
		const j = k + uniformInt(rng, 0, rogue.length - 1 - k);
		[rogue[k], rogue[j]] = [rogue[j], rogue[k]];
	}
	return [
		...order.slice(0, take).map((i) => ({ runner: setup.runners[setup.deckRunner[i]], steps: setup.deckSteps[i] })),
		...rogue.slice(0, setup.rogueToDeck).map((steps) => ({ runner: setup.rogue!, steps }))
	];
}

/** A start-of-stage position with one deal: the scenario format the lab's CLI and API take. */
export function positionScenario(game: Game, setup: RaceSetup, position: StagePosition, deck: ScenarioInput['deck']): ScenarioInput {
	return {
		finish: setup.finish,
		stacks: position.stacks.map((s) => ({ space: s.space, bottomToTop: [...s.bottomToTop] })),
		...(setup.rogue ? { rogue: { runner: setup.rogue } } : {}),
		modifiers: position.modifiers.map((m) => ({ ...m })),
		rules: { ...setup.rules },
		deck
	};
}

/** The snail ranked first when the stage starts (furthest on, top of its stack); none at the gate. */
export function leaderOf(position: StagePosition, rogue?: string): string | undefined {
	const ahead = position.stacks
		.filter((s) => s.space > 0 && s.bottomToTop.some((r) => r !== rogue))
		.sort((a, b) => b.space - a.space)[0];
	return ahead?.bottomToTop.filter((r) => r !== rogue).at(-1);
}

/** The saved scenarios the demo ships: each position with the first deal the pricing used. */
export function demoScenarios(game: Game = demoGame()): { name: string; scenario: ScenarioInput }[] {
	const setup = raceSetupFromGame(game, DEMO_PRICING_PLAYERS);
	return DEMO_STAGE_POSITIONS.map((position, i) => ({
		name: position.name,
		scenario: positionScenario(game, setup, position, dealStage(setup, xoroshiro128plus(positionSeed(i))))
	}));
}

const positionSeed = (i: number) => 1000 + i;

export interface LeaderOdds {
	position: string;
	leader: string;
	/** P(1st), P(2nd), … at stage end, averaged over the deals, and the standard error of each. */
	places: number[];
	standardErrors: number[];
	/** The same for each deal on its own (what the standard errors of expected coins are taken from). */
	perDeal: number[][];
}

/** The leader's place odds at the end of the stage, over `deals` seeded deals of `samples` orders each. */
export function leaderOdds(game: Game, position: StagePosition, index: number, deals: number, samples: number): LeaderOdds {
	const setup = raceSetupFromGame(game, DEMO_PRICING_PLAYERS);
	const leader = leaderOf(position, setup.rogue);
	if (!leader) throw new Error(`“${position.name}” has no leader to price`);
	const rng = xoroshiro128plus(positionSeed(index));
	const perDeal: number[][] = [];
	for (let d = 0; d < deals; d++) {
		const scenario = ScenarioSchema.parse(positionScenario(game, setup, position, dealStage(setup, rng)));
		const odds = monteCarloStage(compileStage(scenario), samples, d + 1);
		perDeal.push(odds.places[odds.runners.indexOf(leader)]);
	}
	const column = (k: number) => perDeal.map((row) => row[k]);
	const R = perDeal[0].length;
	return {
		position: position.name,
		leader,
		places: Array.from({ length: R }, (_, k) => mean(column(k))),
		standardErrors: Array.from({ length: R }, (_, k) => standardError(column(k))),
		perDeal
	};
}

const mean = (xs: readonly number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;

/** Standard error of a mean: each deal's estimate is one draw, holding both the deal's and the sampling noise. */
function standardError(xs: readonly number[]): number {
	const m = mean(xs);
	return Math.sqrt(xs.reduce((s, x) => s + (x - m) ** 2, 0) / Math.max(1, xs.length - 1) / xs.length);
}

export interface TablePrice {
	table: MoneyTable;
	betType: BetType;
	tier: number;
	/**
	 * Expected coins of one card and its standard error: for a stage table, its card on the
	 * leader (over the positions); for a race table, each snail's card (every snail has one).
	 */
	cards: { runner: string; expectedCoins: number; standardError: number }[];
	target: number;
	band: readonly [number, number];
	/** The table's average over the places: what a pick at random expects. */
	blindCoins: number;
}

export interface DemoPricing {
	leaders: LeaderOdds[];
	/** The leaders' place odds averaged over the positions. */
	leaderPlaces: number[];
	leaderStandardErrors: number[];
	race: RaceOdds;
	tables: TablePrice[];
}

/**
 * Standard error of the coins one card wins over `n` independent races, from the place odds:
 * a race puts the snail in one place, so the variance is Σ P × coins² − (Σ P × coins)².
 */
function raceCoinsError(table: MoneyTable, places: readonly number[], n: number): number {
	const m = expectedCoins(table, places);
	const m2 = places.reduce((s, p, i) => s + p * (coinsForPlace(table, i + 1) ?? 0) ** 2, 0);
	return Math.sqrt(Math.max(0, m2 - m * m) / n);
}

export function priceDemo(
	game: Game = demoGame(),
	options: { deals?: number; samples?: number; races?: number; seed?: number } = {}
): DemoPricing {
	const { deals = 400, samples = 2000, races = 100_000, seed = 1 } = options;
	const setup = raceSetupFromGame(game, DEMO_PRICING_PLAYERS);
	const leaders = DEMO_STAGE_POSITIONS.flatMap((p, i) => (leaderOf(p, setup.rogue) ? [leaderOdds(game, p, i, deals, samples)] : []));
	const R = setup.runners.length - (setup.rogue ? 1 : 0);
	const leaderPlaces = Array.from({ length: R }, (_, k) => leaders.reduce((s, l) => s + l.places[k], 0) / leaders.length);
	const leaderStandardErrors = Array.from(
		{ length: R },
		(_, k) => Math.sqrt(leaders.reduce((s, l) => s + l.standardErrors[k] ** 2, 0)) / leaders.length
	);
	// The leader's card over the positions: the mean of each position's mean over its deals.
	const leaderCard = (table: MoneyTable) => ({
		runner: 'leader',
		expectedCoins: mean(leaders.map((l) => mean(l.perDeal.map((p) => expectedCoins(table, p))))),
		standardError: Math.sqrt(leaders.reduce((s, l) => s + standardError(l.perDeal.map((p) => expectedCoins(table, p))) ** 2, 0)) / leaders.length
	});
	const race = simulateRaces(setup, races, seed);

	const tables = game.moneyTables.flatMap((table): TablePrice[] => {
		const goal = DEMO_TABLE_TARGETS[table.id];
		if (!goal) return [];
		const cards =
			goal.betType === 'stage'
				? [leaderCard(table)]
				: race.runners.map((runner, r) => ({
						runner,
						expectedCoins: expectedCoins(table, race.final[r]),
						standardError: raceCoinsError(table, race.final[r], race.races)
					}));
		const blind = Array.from({ length: R }, (_, k) => coinsForPlace(table, k + 1) ?? 0).reduce((a, b) => a + b, 0) / R;
		return [
			{
				table,
				betType: goal.betType,
				tier: goal.tier,
				cards,
				target: goal.target,
				band: goal.band,
				blindCoins: blind
			}
		];
	});
	return { leaders, leaderPlaces, leaderStandardErrors, race, tables };
}

export interface RaceLength {
	players: number;
	/** Track spaces laid (the finish is one past the last). */
	spaces: number;
	meanStages: number;
	stageCounts: RaceOdds['stageCounts'];
	/** Turns each player gets in an average race: one turn per shared-deck card. */
	turnsEach: number;
}

/** How long a race lasts at each player count, from whole races of the game's own setup cards. */
export function raceLengths(game: Game = demoGame(), races = 20_000, seed = 11): RaceLength[] {
	return setupPlayerCounts(game).map((players) => {
		const setup = raceSetupFromGame(game, players);
		const odds = simulateRaces(setup, races, seed);
		return {
			players,
			spaces: setup.finish - 1,
			meanStages: odds.meanStages,
			stageCounts: odds.stageCounts,
			turnsEach: ((setup.sharedCards + setup.rogueToDeck) * odds.meanStages) / players
		};
	});
}
