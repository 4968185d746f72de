import { describe, expect, it } from 'vitest';
import { filterThreads, threadOf, threadsOf } from './threads';
import type { ProofComment } from './types';

const at = (minute: number) => new Date(Date.UTC(2026, 0, 1, 9, minute)).toISOString();
const comment = (id: string, minute: number, extra: Partial<ProofComment> = {}): ProofComment => ({
	id,
	threadId: null,
	cardId: 'card-a',
	side: 'front',
	xMm: 10,
	yMm: 10,
	body: id,
	authorId: 'ann',
	authorName: 'Ann',
	createdAt: at(minute),
	resolvedAt: null,
	...extra
});

// Invented data for the test only.
const comments = [
	comment('r2', 5, { cardId: 'card-b', authorId: 'bo' }),
	comment('r1', 1),
	comment('x1', 7, { threadId: 'r1', authorId: 'bo' }),
	comment('x2', 3, { threadId: 'r1' }),
	comment('r3', 9, { resolvedAt: at(20), authorId: 'cy' })
];
const kinds: Record<string, string> = { 'card-a': 'movement', 'card-b': 'wager' };
const kindOf = (id: string) => kinds[id];

describe('threads', () => {
	it('are numbered in the order they were started, with replies in the order written', () => {
		const t = threadsOf(comments);
		expect(t.map((x) => [x.number, x.root.id])).toEqual([
			[1, 'r1'],
			[2, 'r2'],
			[3, 'r3']
		]);
		expect(t[0].replies.map((r) => r.id)).toEqual(['x2', 'x1']);
		expect(threadOf(t, 'x1')?.root.id).toBe('r1');
		expect(threadOf(t, 'r3')?.number).toBe(3);
		expect(threadOf(t, 'nope')).toBeUndefined();
	});

	it('filter by state, by who wrote in them and by card kind', () => {
		const t = threadsOf(comments);
		const ids = (f: Parameters<typeof filterThreads>[1]) => filterThreads(t, f, kindOf).map((x) => x.root.id);
		expect(ids({ status: 'all', mine: null, kindId: null })).toEqual(['r1', 'r2', 'r3']);
		expect(ids({ status: 'open', mine: null, kindId: null })).toEqual(['r1', 'r2']);
		expect(ids({ status: 'resolved', mine: null, kindId: null })).toEqual(['r3']);
		// Bo started r2 and replied in r1.
		expect(ids({ status: 'all', mine: 'bo', kindId: null })).toEqual(['r1', 'r2']);
		expect(ids({ status: 'all', mine: null, kindId: 'wager' })).toEqual(['r2']);
	});
});
