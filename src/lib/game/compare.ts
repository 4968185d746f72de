/**
 * Comparing two snapshots of a game (two proofs): which cards were added, removed or changed,
 * and whether a change is in the card's data, its layout (the kind) or its art. A card counts as
 * changed when anything its faces are drawn from changed.
 */
import type { ArtAsset, Card, Game } from './model';
import { fieldChanges, type FieldChange } from './history';

export type ChangePart = 'data' | 'layout' | 'art';

export interface CardChange {
	cardId: string;
	name: string;
	kindName: string;
	parts: ChangePart[];
	/** Which fields changed: `card.…` its own, `runner.…`, `moneyTable.…`, `kind.…`, `rogue.…`, `art.<slot>`. */
	fields: FieldChange[];
}

export interface ProofComparison {
	added: { cardId: string; name: string; kindName: string }[];
	removed: { cardId: string; name: string; kindName: string }[];
	changed: CardChange[];
	unchanged: number;
}

const withoutVersion = (o: object | undefined) =>
	o ? JSON.stringify(o, (k, v) => (k === 'version' ? undefined : v)) : '';

function artOf(game: Game, card: Card): ArtAsset[] {
	const runnerId = card.data.type === 'movement' || card.data.type === 'wager' ? card.data.runnerId : undefined;
	const rogueId = card.data.type === 'rogue' ? game.rogueRunner?.id : undefined;
	return game.art.filter((a) => {
		const as = a.assignment;
		if (!as) return false;
		return (
			(as.scope === 'card' && as.targetId === card.id) ||
			(as.scope === 'kind' && as.targetId === card.kindId) ||
			(as.scope === 'runner' && (as.targetId === runnerId || as.targetId === rogueId))
		);
	});
}

/** Everything a card's faces are drawn from, as one object whose fields can be compared. */
function drawnFrom(game: Game, card: Card) {
	const d = card.data;
	const strip = (o: object | undefined) => (o ? JSON.parse(withoutVersion(o)) : undefined);
	return {
		card: strip(card),
		runner: strip(d.type === 'movement' || d.type === 'wager' ? game.runners.find((r) => r.id === d.runnerId) : undefined),
		moneyTable: strip(d.type === 'wager' ? game.moneyTables.find((t) => t.id === d.moneyTableId) : undefined),
		rogue: strip(d.type === 'rogue' ? game.rogueRunner : undefined),
		kind: strip(game.kinds.find((k) => k.id === card.kindId)),
		art: Object.fromEntries(artOf(game, card).map((a) => [a.assignment!.slot, a.fileName + (a.status === 'final' ? '' : ` (${a.status})`) + ` ${a.sha256.slice(0, 8)}`]))
	};
}

/** The fields of everything a card is drawn from that differ between two snapshots. */
export function cardFieldChanges(before: Game, was: Card, after: Game, card: Card): FieldChange[] {
	return fieldChanges(drawnFrom(before, was), drawnFrom(after, card));
}

/** What a card's faces are drawn from, in three parts. */
export function cardInputs(game: Game, card: Card): Record<ChangePart, string> {
	const kind = game.kinds.find((k) => k.id === card.kindId);
	const d = card.data;
	const runner = d.type === 'movement' || d.type === 'wager' ? game.runners.find((r) => r.id === d.runnerId) : undefined;
	const table = d.type === 'wager' ? game.moneyTables.find((t) => t.id === d.moneyTableId) : undefined;
	const rogue = d.type === 'rogue' ? game.rogueRunner : undefined;
	return {
		data: [withoutVersion(card), withoutVersion(runner), withoutVersion(table), withoutVersion(rogue)].join('|'),
		// The shared back prints the game's name.
		layout: [withoutVersion(kind), game.name].join('|'),
		art: artOf(game, card)
			.map((a) => `${a.assignment!.slot}:${a.sha256}`)
			.sort()
			.join('|')
	};
}

export function compareGames(before: Game, after: Game): ProofComparison {
	const kindName = (g: Game, c: Card) => g.kinds.find((k) => k.id === c.kindId)?.name ?? '';
	const old = new Map(before.cards.map((c) => [c.id, c]));
	const now = new Map(after.cards.map((c) => [c.id, c]));
	const result: ProofComparison = { added: [], removed: [], changed: [], unchanged: 0 };
	for (const [id, card] of now) {
		const was = old.get(id);
		if (!was) {
			result.added.push({ cardId: id, name: card.name, kindName: kindName(after, card) });
			continue;
		}
		const a = cardInputs(before, was);
		const b = cardInputs(after, card);
		const parts = (['data', 'layout', 'art'] as const).filter((p) => a[p] !== b[p]);
		if (parts.length) result.changed.push({ cardId: id, name: card.name, kindName: kindName(after, card), parts: [...parts], fields: cardFieldChanges(before, was, after, card) });
		else result.unchanged++;
	}
	for (const [id, card] of old) {
		if (!now.has(id)) result.removed.push({ cardId: id, name: card.name, kindName: kindName(before, card) });
	}
	return result;
}
