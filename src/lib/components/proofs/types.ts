/** The shapes the proof pages read: cards with their face box, and comments and verdicts as the API sends them. */

import type { ChangePart } from '$lib/game/compare';
import type { FieldChange } from '$lib/game/history';

export type Side = 'front' | 'back';

export interface ProofCard {
	id: string;
	name: string;
	kindId: string;
	kindName: string;
	/** Its key values in one line ("Runner Rosehip · Steps 3"), for text alternatives. */
	summary: string;
	copies: number;
	trimWidthMm: number;
	trimHeightMm: number;
	bleedMm: number;
	safeMm: number;
	/** The face box face.svg draws: trim + 2 × bleed. */
	widthMm: number;
	heightMm: number;
}

export interface ProofComment {
	id: string;
	/** The thread's first comment; null on a first comment. */
	threadId: string | null;
	cardId: string;
	side: Side;
	xMm: number;
	yMm: number;
	body: string;
	authorId: string | null;
	authorName: string | null;
	createdAt: string;
	resolvedAt: string | null;
}

export interface Verdict {
	id: string;
	reviewerId: string;
	reviewerName: string;
	verdict: 'approve' | 'changes';
	note: string;
	createdAt: string;
}

export interface Thread {
	/** 1, 2, 3… in the order the threads were started: the number on the pin. */
	number: number;
	root: ProofComment;
	replies: ProofComment[];
}

/** A pin being placed, not yet sent. */
export interface PendingPin {
	cardId: string;
	side: Side;
	xMm: number;
	yMm: number;
}

/** A proof's header as the pages show it. */
export interface ProofHeader {
	id: string;
	number: number;
	description: string;
	createdAt: Date | string;
	createdBy: string | null;
	releasedAt: Date | string | null;
	releasedBy: string | null;
	withdrawnAt: Date | string | null;
	withdrawNote: string;
	/** Released and not withdrawn. */
	released: boolean;
}

export interface GameRef {
	id: string;
	name: string;
	teamId: string;
}

/** How a card differs from the same card in the previous proof (absent: unchanged). */
export interface CardChangeMark {
	status: 'added' | 'changed';
	parts: ChangePart[];
	fields: FieldChange[];
}
