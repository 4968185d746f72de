import { describe, expect, it } from 'vitest';
import { cardsMatching, queryOf, stateOf, step, viewFromQuery, NO_FILTER } from './card-view';
import { threadsOf } from './threads';
import type { CardChangeMark, ProofComment } from './types';

const comment = (id: string, cardId: string, resolved: boolean): ProofComment => ({
	id,
	threadId: null,
	cardId,
	side: 'front',
	xMm: 5,
	yMm: 5,
	body: id,
	authorId: 'ann',
	authorName: 'Ann',
	createdAt: new Date(Date.UTC(2026, 0, 1, 9, id.length)).toISOString(),
	resolvedAt: resolved ? new Date(Date.UTC(2026, 0, 2)).toISOString() : null
});

const cards = [
	{ id: 'a', kindId: 'move' },
	{ id: 'b', kindId: 'move' },
	{ id: 'c', kindId: 'wager' },
	{ id: 'd', kindId: 'wager' }
];
const threads = threadsOf([comment('x', 'a', false), comment('yy', 'b', true), comment('zzz', 'a', true)]);
const changed: CardChangeMark = { status: 'changed', parts: ['data'], fields: [{ field: 'card.name', before: 'Old', after: 'New' }] };
const changes: Record<string, CardChangeMark> = { b: changed, d: { status: 'added', parts: [], fields: [] } };

describe('which cards the proof viewer shows', () => {
	it('reads the review state of a card from its threads', () => {
		expect(stateOf('a', threads)).toBe('open');
		expect(stateOf('b', threads)).toBe('resolved');
		expect(stateOf('c', threads)).toBe('quiet');
	});

	it('combines the kind, review and change filters', () => {
		const ids = (view: Parameters<typeof cardsMatching>[1]) => cardsMatching(cards, view, threads, changes).map((c) => c.id);
		expect(ids(NO_FILTER)).toEqual(['a', 'b', 'c', 'd']);
		expect(ids({ kind: 'wager', state: null, changed: null })).toEqual(['c', 'd']);
		expect(ids({ kind: null, state: 'quiet', changed: null })).toEqual(['c', 'd']);
		expect(ids({ kind: null, state: null, changed: 'changed' })).toEqual(['b', 'd']);
		expect(ids({ kind: null, state: null, changed: 'added' })).toEqual(['d']);
		expect(ids({ kind: null, state: null, changed: 'unchanged' })).toEqual(['a', 'c']);
		expect(ids({ kind: 'move', state: 'resolved', changed: 'changed' })).toEqual(['b']);
	});

	it('ignores the change filter on a first proof (nothing to compare with)', () => {
		expect(cardsMatching(cards, { kind: null, state: null, changed: 'added' }, threads, null)).toHaveLength(4);
	});

	it('round-trips the view through the query string and keeps other parameters', () => {
		const view = { kind: 'move', state: 'open' as const, changed: 'changed' as const, card: 'a b' };
		const query = queryOf(view, new URLSearchParams('other=1'));
		expect(query).toBe('?other=1&kind=move&state=open&changed=changed&card=a+b');
		expect(viewFromQuery(new URLSearchParams(query))).toEqual(view);
		expect(queryOf(NO_FILTER)).toBe('');
	});

	it('ignores values a link made up', () => {
		expect(viewFromQuery(new URLSearchParams('state=approved&changed=__proto__&kind='))).toEqual(NO_FILTER);
	});

	it('steps through the cards, wrapping round', () => {
		expect(step(cards, 'a', 1)?.id).toBe('b');
		expect(step(cards, 'a', -1)?.id).toBe('d');
		expect(step(cards, 'd', 1)?.id).toBe('a');
		expect(step(cards, 'gone', 1)?.id).toBe('a');
		expect(step([], 'a', 1)).toBeNull();
	});
});
