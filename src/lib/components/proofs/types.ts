/**
 * The proof pages' shapes: what the server hands them comes from its schemas ($lib/schemas/proofs);
 * threads, a pin being placed and a card's change mark are built by the pages themselves.
 */
import type { ProofComment, Side } from '$lib/schemas/proofs';
import type { ChangePart } from '$lib/game/compare';
import type { FieldChange } from '$lib/game/history';

export type { ProofCard, ProofComment, ProofHeader, Side, ProofVerdict as Verdict, ProofGame as GameRef } from '$lib/schemas/proofs';

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

/** How a card differs from the same card in the previous proof (absent: unchanged). */
export interface CardChangeMark {
	status: 'added' | 'changed';
	parts: ChangePart[];
	fields: FieldChange[];
}
