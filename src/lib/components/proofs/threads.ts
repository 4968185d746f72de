/** Comments grouped into threads (a pinned first comment and its replies), numbered, and filtered. */
import type { ProofComment, Thread } from './types';

/** Threads in the order they were started; replies in the order written. */
export function threadsOf(comments: ProofComment[]): Thread[] {
	const byTime = [...comments].sort((a, b) => a.createdAt.localeCompare(b.createdAt) || a.id.localeCompare(b.id));
	const threads = new Map<string, Thread>();
	for (const c of byTime) if (!c.threadId) threads.set(c.id, { number: threads.size + 1, root: c, replies: [] });
	for (const c of byTime) if (c.threadId) threads.get(c.threadId)?.replies.push(c);
	return [...threads.values()];
}

/** The thread a comment (first or reply) belongs to. */
export const threadOf = (threads: Thread[], commentId: string) =>
	threads.find((t) => t.root.id === commentId || t.replies.some((r) => r.id === commentId));

export interface ThreadFilter {
	status: 'open' | 'resolved' | 'all';
	/** Only threads this person wrote in. */
	mine: string | null;
	/** Only threads on cards of this kind. */
	kindId: string | null;
}

export function filterThreads(threads: Thread[], filter: ThreadFilter, kindOfCard: (cardId: string) => string | undefined) {
	return threads.filter((t) => {
		if (filter.status === 'open' && t.root.resolvedAt) return false;
		if (filter.status === 'resolved' && !t.root.resolvedAt) return false;
		if (filter.mine && t.root.authorId !== filter.mine && !t.replies.some((r) => r.authorId === filter.mine)) return false;
		if (filter.kindId && kindOfCard(t.root.cardId) !== filter.kindId) return false;
		return true;
	});
}
