/**
 * Card generators: whole decks from a few numbers, so a rules tweak is one edit.
 *
 * Ids and names are deterministic (built from the kind, runner and values), so regenerating the
 * same matrix gives the same ids, and proofs can tell which cards really changed.
 */
import type {
	BetType,
	Card,
	CardKind,
	CardKindType,
	Id,
	MoneyTable,
	RogueRunner,
	Runner,
	TileData,
	TileRole
} from './model';

function requireType(kind: CardKind, type: CardKindType) {
	if (kind.type !== type) throw new Error(`Card kind “${kind.name}” is ${kind.type}, not ${type}`);
}

function requireSteps(steps: readonly number[]) {
	if (steps.length === 0) throw new Error('Give at least one step value');
	const seen = new Set<number>();
	for (const s of steps) {
		if (!Number.isInteger(s) || s < 1 || s > 9) throw new Error(`Step value ${s} must be a whole number 1..9`);
		if (seen.has(s)) throw new Error(`Step value ${s} is given twice`);
		seen.add(s);
	}
}

function requireCopies(copies: number) {
	if (!Number.isInteger(copies) || copies < 0 || copies > 999) throw new Error(`Copies ${copies} must be 0..999`);
}

const byOrder = (runners: readonly Runner[]) =>
	[...runners].sort((a, b) => a.sortOrder - b.sortOrder || a.name.localeCompare(b.name));

/* ---------------------------------------------------------------- movement */

export interface MovementMatrix {
	kind: CardKind;
	runners: readonly Runner[];
	/** Step values, e.g. [1, 2, 4]. */
	steps: readonly number[];
	/** Copies of each runner × step card. */
	copies: number;
}

export function movementCardId(kindId: Id, runnerId: Id, steps: number): Id {
	return `${kindId}.mv.${runnerId}.${steps}`;
}

/** One card per runner × step value (runners in their sort order, steps ascending). */
export function generateMovementCards({ kind, runners, steps, copies }: MovementMatrix): Card[] {
	requireType(kind, 'movement');
	requireSteps(steps);
	requireCopies(copies);
	const sorted = [...steps].sort((a, b) => a - b);
	return byOrder(runners).flatMap((runner) =>
		sorted.map(
			(s): Card => ({
				id: movementCardId(kind.id, runner.id, s),
				kindId: kind.id,
				name: `${runner.name} ${s}`,
				data: { type: 'movement', runnerId: runner.id, steps: s },
				copies
			})
		)
	);
}

/* ------------------------------------------------------------------- rogue */

export interface RogueMatrix {
	kind: CardKind;
	rogue: RogueRunner;
	steps: readonly number[];
	copies: number;
}

export function rogueCardId(kindId: Id, steps: number): Id {
	return `${kindId}.rg.${steps}`;
}

/** The wrong-way runner's cards, one per step value. */
export function generateRogueCards({ kind, rogue, steps, copies }: RogueMatrix): Card[] {
	requireType(kind, 'rogue');
	requireSteps(steps);
	requireCopies(copies);
	return [...steps]
		.sort((a, b) => a - b)
		.map((s) => ({
			id: rogueCardId(kind.id, s),
			kindId: kind.id,
			name: `${rogue.name} back ${s}`,
			data: { type: 'rogue', steps: s },
			copies
		}));
}

/* ------------------------------------------------------------------- wager */

export interface WagerMatrix {
	kind: CardKind;
	runners: readonly Runner[];
	/**
	 * Per bet type, the money table of each tier in order: index 0 is tier 1 (taken first,
	 * wins most). Bet types left out get no cards.
	 */
	tiers: Partial<Record<BetType, readonly Id[]>>;
	moneyTables: readonly MoneyTable[];
	copies: number;
}

export function wagerCardId(kindId: Id, betType: BetType, runnerId: Id, tier: number): Id {
	return `${kindId}.wg.${betType}.${runnerId}.${tier}`;
}

const BET_LABEL: Record<BetType, string> = { stage: 'stage', winner: 'winner', loser: 'last place' };
const BET_ORDER: readonly BetType[] = ['stage', 'winner', 'loser'];

/** One card per bet type × runner × tier, each printing its tier's money table. */
export function generateWagerCards({ kind, runners, tiers, moneyTables, copies }: WagerMatrix): Card[] {
	requireType(kind, 'wager');
	requireCopies(copies);
	const tables = new Set(moneyTables.map((t) => t.id));
	const cards: Card[] = [];
	for (const betType of BET_ORDER) {
		const tableIds = tiers[betType];
		if (!tableIds) continue;
		if (tableIds.length === 0) throw new Error(`Bet type ${betType} has no tiers`);
		if (tableIds.length > 12) throw new Error(`Bet type ${betType} has more than 12 tiers`);
		for (const id of tableIds) if (!tables.has(id)) throw new Error(`Money table ${id} does not exist`);
		for (const runner of byOrder(runners))
			tableIds.forEach((moneyTableId, i) => {
				const tier = i + 1;
				cards.push({
					id: wagerCardId(kind.id, betType, runner.id, tier),
					kindId: kind.id,
					name: `${runner.name} ${BET_LABEL[betType]} tier ${tier}`,
					data: { type: 'wager', betType, runnerId: runner.id, tier, moneyTableId },
					copies
				});
			});
	}
	return cards;
}

/* ------------------------------------------------------------------- tiles */

export interface TileRun {
	kind: CardKind;
	/** Tiles in all, start and finish included (at least 2). */
	count: number;
	spacesFront: number;
	/** Spaces on the reverse (narrowed) side of the normal tiles. */
	spacesBack: number;
	backLabel: string;
	/** Spaces of the start and finish tiles, front and back (default: as the normal tiles). */
	endSpaces?: number;
	startLabel?: string;
	finishLabel?: string;
}

export function tileCardId(kindId: Id, number: number): Id {
	return `${kindId}.tl.${number}`;
}

/** Numbered double-sided tiles: 1 is the start, the last one the finish, one copy each. */
export function generateTiles(run: TileRun): Card[] {
	requireType(run.kind, 'tile');
	if (!Number.isInteger(run.count) || run.count < 2 || run.count > 999)
		throw new Error('A track needs at least a start and a finish tile');
	const cards: Card[] = [];
	for (let n = 1; n <= run.count; n++) {
		const role: TileRole = n === 1 ? 'start' : n === run.count ? 'finish' : 'normal';
		const end = role !== 'normal';
		const data: TileData = {
			type: 'tile',
			number: n,
			role,
			spacesFront: end ? (run.endSpaces ?? run.spacesFront) : run.spacesFront,
			spacesBack: end ? (run.endSpaces ?? run.spacesBack) : run.spacesBack,
			backLabel:
				role === 'start' ? (run.startLabel ?? run.backLabel) : role === 'finish' ? (run.finishLabel ?? run.backLabel) : run.backLabel
		};
		cards.push({
			id: tileCardId(run.kind.id, n),
			kindId: run.kind.id,
			name: `Tile ${n}`,
			data,
			copies: 1
		});
	}
	return cards;
}

/* ------------------------------------------------------------------ merge */

/**
 * Puts freshly generated cards of one kind in place of the old ones. A card whose id survives
 * keeps its `version` (so optimistic locking still sees the same row); cards of other kinds
 * are untouched and keep their order.
 */
export function replaceKindCards(cards: readonly Card[], kindId: Id, generated: readonly Card[]): Card[] {
	for (const c of generated)
		if (c.kindId !== kindId) throw new Error(`Generated card ${c.id} belongs to another kind`);
	const old = new Map(cards.filter((c) => c.kindId === kindId).map((c) => [c.id, c]));
	const fresh = generated.map((c) => {
		const before = old.get(c.id);
		return before?.version === undefined ? c : { ...c, version: before.version };
	});
	const firstIndex = cards.findIndex((c) => c.kindId === kindId);
	if (firstIndex < 0) return [...cards, ...fresh];
	const before = cards.slice(0, firstIndex).filter((c) => c.kindId !== kindId);
	const after = cards.slice(firstIndex).filter((c) => c.kindId !== kindId);
	return [...before, ...fresh, ...after];
}
