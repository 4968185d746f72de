/**
 * Prices wager cards: a card's expected coins are Σ P(place) × coins its money table pays for
 * that place (its tier picks the table). Stage wagers read the stage odds, winner and last-place
 * wagers the race-end odds. A card paying more than the designer's target is flagged, with the
 * value of its table's top row that would bring it down to the target.
 */
import { coinsForPlace, type BetType, type Card, type Game, type MoneyTable } from '../game/model';

/** Place probabilities per runner id: `[P(1st), P(2nd), …]`. */
export type PlaceOdds = Record<string, number[]>;

export interface WagerPrice {
	cardId: string;
	cardName: string;
	betType: BetType;
	runnerId: string;
	tier: number;
	moneyTableId: string;
	moneyTableName: string;
	expectedCoins: number;
	/** Above the target. */
	generous: boolean;
	/** The place of the table's top row and the coins it would need to pay to meet the target. */
	topRowPlace?: number;
	topRowSuggestion?: number;
}

/** Σ P(place) × coins; a place the table does not cover pays nothing. */
export function expectedCoins(table: MoneyTable, places: readonly number[]): number {
	let sum = 0;
	places.forEach((p, i) => {
		sum += p * (coinsForPlace(table, i + 1) ?? 0);
	});
	return sum;
}

/**
 * The top row's coins (rounded down to whole coins) that make the expectation at most `target`,
 * or undefined when the top row's place cannot happen (changing it changes nothing).
 */
export function topRowToMeet(table: MoneyTable, places: readonly number[], target: number): { place: number; coins: number } | undefined {
	const top = table.rows[0];
	if (!top) return undefined;
	const p = places[top.place - 1] ?? 0;
	if (p <= 0) return undefined;
	const rest = expectedCoins(table, places) - p * top.coins;
	return { place: top.place, coins: Math.floor((target - rest) / p + 1e-9) };
}

export interface PriceOptions {
	/** Odds at the end of a stage, for stage wagers. */
	stage?: PlaceOdds;
	/** Odds at race end, for winner and last-place wagers. */
	race?: PlaceOdds;
	/** Coins a card may be expected to pay (default 0). */
	target?: number;
}

/** Every wager card whose runner and bet type have odds. */
export function priceWagers(game: Pick<Game, 'cards' | 'moneyTables'>, options: PriceOptions): WagerPrice[] {
	const target = options.target ?? 0;
	const tables = new Map(game.moneyTables.map((t) => [t.id, t]));
	const out: WagerPrice[] = [];
	for (const card of game.cards as Card[]) {
		const d = card.data;
		if (d.type !== 'wager') continue;
		const odds = d.betType === 'stage' ? options.stage : options.race;
		const places = odds?.[d.runnerId];
		const table = tables.get(d.moneyTableId);
		if (!places || !table) continue;
		const expected = expectedCoins(table, places);
		const generous = expected > target + 1e-9;
		const fix = generous ? topRowToMeet(table, places, target) : undefined;
		out.push({
			cardId: card.id,
			cardName: card.name,
			betType: d.betType,
			runnerId: d.runnerId,
			tier: d.tier,
			moneyTableId: table.id,
			moneyTableName: table.name,
			expectedCoins: expected,
			generous,
			...(fix ? { topRowPlace: fix.place, topRowSuggestion: fix.coins } : {})
		});
	}
	return out;
}

/** Runner id → place probabilities, from parallel arrays. */
export function placeOdds(runners: readonly string[], places: readonly number[][]): PlaceOdds {
	return Object.fromEntries(runners.map((r, i) => [r, places[i]]));
}
