/**
 * Which of a proof's cards the viewer shows and which one is open large, as plain data that
 * round-trips through the page's query string (so a filtered grid or an open card is a link).
 */
import type { CardChangeMark, Thread } from './types';

/** What the review recorded on a card: its comment threads, open or resolved. */
export const CARD_STATES = {
	open: 'With open comments',
	resolved: 'Comments all resolved',
	quiet: 'No comments'
} as const;
export type CardState = keyof typeof CARD_STATES;

/** Against the proof cut before this one. */
export const CHANGE_FILTERS = {
	changed: 'Changed or new',
	added: 'New only',
	unchanged: 'Unchanged'
} as const;
export type ChangeFilter = keyof typeof CHANGE_FILTERS;

export interface CardView {
	kind: string | null;
	state: CardState | null;
	changed: ChangeFilter | null;
	/** The card open large, or null for the grid. */
	card: string | null;
}

export const NO_FILTER: CardView = { kind: null, state: null, changed: null, card: null };

const pick = <T extends string>(value: string | null, allowed: Record<T, string>): T | null =>
	value && Object.hasOwn(allowed, value) ? (value as T) : null;

/** Unknown values are ignored, not refused: an old or edited link still opens the proof. */
export function viewFromQuery(query: URLSearchParams): CardView {
	return {
		kind: query.get('kind') || null,
		state: pick(query.get('state'), CARD_STATES),
		changed: pick(query.get('changed'), CHANGE_FILTERS),
		card: query.get('card') || null
	};
}

/** `view` written into `query`, other parameters kept (a filter left empty is left out). */
export function queryOf(view: CardView, query = new URLSearchParams()): string {
	const out = new URLSearchParams(query);
	for (const key of ['kind', 'state', 'changed', 'card'] as const) {
		const value = view[key];
		if (value) out.set(key, value);
		else out.delete(key);
	}
	const text = out.toString();
	return text ? `?${text}` : '';
}

export function stateOf(cardId: string, threads: readonly Thread[]): CardState {
	const mine = threads.filter((t) => t.root.cardId === cardId);
	if (mine.length === 0) return 'quiet';
	return mine.some((t) => !t.root.resolvedAt) ? 'open' : 'resolved';
}

export function changeMatches(filter: ChangeFilter, mark: CardChangeMark | undefined): boolean {
	if (filter === 'unchanged') return !mark;
	if (filter === 'added') return mark?.status === 'added';
	return !!mark;
}

/** The cards the filters let through, in the proof's order. */
export function cardsMatching<C extends { id: string; kindId: string }>(
	cards: readonly C[],
	view: Pick<CardView, 'kind' | 'state' | 'changed'>,
	threads: readonly Thread[],
	changes: Record<string, CardChangeMark> | null
): C[] {
	return cards.filter(
		(c) =>
			(!view.kind || c.kindId === view.kind) &&
			(!view.state || stateOf(c.id, threads) === view.state) &&
			(!view.changed || !changes || changeMatches(view.changed, changes[c.id]))
	);
}

/** The card before or after `cardId` in `list`, wrapping round; null when the list is empty. */
export function step<C extends { id: string }>(list: readonly C[], cardId: string, by: 1 | -1): C | null {
	if (list.length === 0) return null;
	const at = list.findIndex((c) => c.id === cardId);
	if (at < 0) return list[0];
	return list[(at + by + list.length) % list.length];
}
