/**
 * The generator forms of a kind page: one schema per generated type, the run a form starts
 * with (read back from the kind's current cards), and the changes a run makes to the kind.
 * The cards themselves come from src/lib/game/generate.ts; the result is ordinary cards that
 * stay editable one by one.
 */
import { z } from 'zod';
import { BET_TYPES, IdSchema, type BetType, type Card, type CardKind, type Game, type Id } from './model';
import { generateMovementCards, generateRogueCards, generateTiles, generateWagerCards } from './generate';

const copies = z.int().min(0).max(999);
const steps = z
	.array(z.int().min(1).max(9))
	.min(1, 'Pick at least one step value')
	.refine((s) => new Set(s).size === s.length, 'Each step value once');
/** Replace: the kind's cards that the run does not make are removed. */
const replace = z.boolean();
const runnerIds = z.array(IdSchema).min(1, 'Pick at least one runner');

export const MovementRunSchema = z.object({ type: z.literal('movement'), runnerIds, steps, copies, replace });
export const RogueRunSchema = z.object({ type: z.literal('rogue'), steps, copies, replace });
export const WagerRunSchema = z
	.object({
		type: z.literal('wager'),
		runnerIds,
		/** Per bet type, the money table of each tier in order (tier 1 first); empty: no cards. */
		tiers: z.object({
			stage: z.array(IdSchema).max(12),
			winner: z.array(IdSchema).max(12),
			loser: z.array(IdSchema).max(12)
		}),
		copies,
		replace
	})
	.refine((r) => BET_TYPES.some((b) => r.tiers[b].length > 0), { message: 'Give at least one bet type a tier', path: ['tiers'] });
export const TileRunSchema = z.object({
	type: z.literal('tile'),
	count: z.int().min(2, 'A track needs a start and a finish tile').max(999),
	spacesFront: z.int().min(0).max(20),
	spacesBack: z.int().min(0).max(20),
	backLabel: z.string().trim().max(40),
	endSpaces: z.int().min(0).max(20),
	startLabel: z.string().trim().max(40),
	finishLabel: z.string().trim().max(40),
	replace
});

export type MovementRun = z.infer<typeof MovementRunSchema>;
export type RogueRun = z.infer<typeof RogueRunSchema>;
export type WagerRun = z.infer<typeof WagerRunSchema>;
export type TileRun = z.infer<typeof TileRunSchema>;
export type Run = MovementRun | RogueRun | WagerRun | TileRun;

export const RUN_SCHEMAS = {
	movement: MovementRunSchema,
	rogue: RogueRunSchema,
	wager: WagerRunSchema,
	tile: TileRunSchema
} as const;
export type GeneratedType = keyof typeof RUN_SCHEMAS;

export const isGenerated = (type: CardKind['type']): type is GeneratedType => type in RUN_SCHEMAS;

type GameParts = Pick<Game, 'runners' | 'rogueRunner' | 'moneyTables' | 'cards'>;

const distinct = (values: number[]) => [...new Set(values)].sort((a, b) => a - b);
const ordered = (game: GameParts) => [...game.runners].sort((a, b) => a.sortOrder - b.sortOrder).map((r) => r.id);

/** The form's first values: what the kind holds now, or a small starting matrix. */
export function currentRun(kind: CardKind, game: GameParts): Run | null {
	const cards = game.cards.filter((c) => c.kindId === kind.id);
	const firstCopies = cards[0]?.copies;
	switch (kind.type) {
		case 'movement': {
			const data = cards.flatMap((c) => (c.data.type === 'movement' ? [c.data] : []));
			const used = new Set(data.map((d) => d.runnerId));
			return {
				type: 'movement',
				runnerIds: used.size ? ordered(game).filter((id) => used.has(id)) : ordered(game),
				steps: data.length ? distinct(data.map((d) => d.steps)) : [1, 2, 4],
				copies: firstCopies ?? 2,
				replace: true
			};
		}
		case 'rogue': {
			const data = cards.flatMap((c) => (c.data.type === 'rogue' ? [c.data] : []));
			return { type: 'rogue', steps: data.length ? distinct(data.map((d) => d.steps)) : [2, 3], copies: firstCopies ?? 1, replace: true };
		}
		case 'wager': {
			const data = cards.flatMap((c) => (c.data.type === 'wager' ? [c.data] : []));
			const tiers = { stage: [] as Id[], winner: [] as Id[], loser: [] as Id[] };
			for (const bet of BET_TYPES) {
				const byTier = new Map<number, Id>();
				for (const d of data) if (d.betType === bet && !byTier.has(d.tier)) byTier.set(d.tier, d.moneyTableId);
				const top = Math.max(0, ...byTier.keys());
				// Tiers are contiguous from 1; a gap takes the tier before it.
				for (let t = 1; t <= top; t++) tiers[bet].push(byTier.get(t) ?? tiers[bet][t - 2] ?? game.moneyTables[0]?.id);
			}
			const used = new Set(data.map((d) => d.runnerId));
			return {
				type: 'wager',
				runnerIds: used.size ? ordered(game).filter((id) => used.has(id)) : ordered(game),
				tiers,
				copies: firstCopies ?? 1,
				replace: true
			};
		}
		case 'tile': {
			const data = cards.flatMap((c) => (c.data.type === 'tile' ? [c.data] : []));
			const normal = data.find((d) => d.role === 'normal');
			const start = data.find((d) => d.role === 'start');
			const finish = data.find((d) => d.role === 'finish');
			return {
				type: 'tile',
				count: data.length >= 2 ? data.length : 8,
				spacesFront: normal?.spacesFront ?? 4,
				spacesBack: normal?.spacesBack ?? 3,
				backLabel: normal?.backLabel ?? '',
				endSpaces: start?.spacesFront ?? normal?.spacesFront ?? 3,
				startLabel: start?.backLabel ?? '',
				finishLabel: finish?.backLabel ?? '',
				replace: true
			};
		}
		default:
			return null;
	}
}

/** The cards a run makes. Throws with a message for people when the run cannot be made. */
export function runCards(kind: CardKind, game: GameParts, run: Run): Card[] {
	if (run.type !== kind.type) throw new Error(`This generator makes ${run.type} cards; “${kind.name}” holds ${kind.type} cards`);
	const pick = (ids: readonly Id[]) => {
		const chosen = game.runners.filter((r) => ids.includes(r.id));
		if (chosen.length !== new Set(ids).size) throw new Error('A chosen runner is not in the game');
		return chosen;
	};
	switch (run.type) {
		case 'movement':
			return generateMovementCards({ kind, runners: pick(run.runnerIds), steps: run.steps, copies: run.copies });
		case 'rogue':
			if (!game.rogueRunner) throw new Error('The game has no rogue runner; add one in the game settings first');
			return generateRogueCards({ kind, rogue: game.rogueRunner, steps: run.steps, copies: run.copies });
		case 'wager': {
			const tiers: Partial<Record<BetType, Id[]>> = {};
			for (const bet of BET_TYPES) if (run.tiers[bet].length) tiers[bet] = run.tiers[bet];
			return generateWagerCards({ kind, runners: pick(run.runnerIds), tiers, moneyTables: game.moneyTables, copies: run.copies });
		}
		case 'tile':
			return generateTiles({
				kind,
				count: run.count,
				spacesFront: run.spacesFront,
				spacesBack: run.spacesBack,
				backLabel: run.backLabel,
				endSpaces: run.endSpaces,
				startLabel: run.startLabel || undefined,
				finishLabel: run.finishLabel || undefined
			});
	}
}

/** One write of a run, in the shape the game store applies (see applyChanges). */
export interface CardWrite {
	id: Id;
	/** The version the card has now; null for a new card. */
	baseVersion: number | null;
	object?: Card;
	remove?: true;
}

export interface RunPlan {
	writes: CardWrite[];
	added: number;
	updated: number;
	removed: number;
	unchanged: number;
}

/** Stored data may come back with its keys in another order (PostgreSQL jsonb sorts them). */
const sameData = (a: Card['data'], b: Card['data']) => {
	const x = a as Record<string, unknown>;
	const y = b as Record<string, unknown>;
	const keys = new Set([...Object.keys(x), ...Object.keys(y)]);
	return [...keys].every((k) => JSON.stringify(x[k]) === JSON.stringify(y[k]));
};
const sameCard = (a: Card, b: Card) => a.name === b.name && a.copies === b.copies && sameData(a.data, b.data);

/**
 * What a run changes: generated ids that exist are updated (or left alone when equal), new ones
 * added; with `replace`, the kind's other cards are removed.
 */
export function planRun(existing: readonly Card[], kindId: Id, generated: readonly Card[], replaceOthers: boolean): RunPlan {
	const current = new Map(existing.filter((c) => c.kindId === kindId).map((c) => [c.id, c]));
	const plan: RunPlan = { writes: [], added: 0, updated: 0, removed: 0, unchanged: 0 };
	const made = new Set<Id>();
	for (const card of generated) {
		made.add(card.id);
		const before = current.get(card.id);
		if (!before) {
			plan.writes.push({ id: card.id, baseVersion: null, object: card });
			plan.added++;
		} else if (sameCard(before, card)) plan.unchanged++;
		else {
			plan.writes.push({ id: card.id, baseVersion: before.version ?? null, object: card });
			plan.updated++;
		}
	}
	if (replaceOthers)
		for (const card of current.values())
			if (!made.has(card.id)) {
				plan.writes.push({ id: card.id, baseVersion: card.version ?? 0, remove: true });
				plan.removed++;
			}
	// Removals first, so a new card may take the name of one that goes.
	plan.writes.sort((a, b) => Number(!!b.remove) - Number(!!a.remove));
	return plan;
}
