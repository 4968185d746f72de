/**
 * What the proof pages and the proof API hand the browser: a proof's cards with their face box,
 * its comments and verdicts, and its header. The server builds these; the components read the
 * inferred types, so neither side re-declares them.
 */
import { z } from 'zod';

export const SideSchema = z.enum(['front', 'back']);
export type Side = z.output<typeof SideSchema>;

export const ProofCardSchema = z.object({
	id: z.string(),
	name: z.string(),
	kindId: z.string(),
	kindName: z.string(),
	/** Its key values in one line ("Runner Rosehip · Steps 3"), for text alternatives. */
	summary: z.string(),
	copies: z.int(),
	trimWidthMm: z.number(),
	trimHeightMm: z.number(),
	bleedMm: z.number(),
	safeMm: z.number(),
	/** The face box face.svg draws: trim + 2 × bleed. */
	widthMm: z.number(),
	heightMm: z.number()
});
export type ProofCard = z.output<typeof ProofCardSchema>;

export const ProofCommentSchema = z.object({
	id: z.string(),
	/** The thread's first comment; null on a first comment. */
	threadId: z.string().nullable(),
	cardId: z.string(),
	side: SideSchema,
	xMm: z.number(),
	yMm: z.number(),
	body: z.string(),
	authorId: z.string().nullable(),
	authorName: z.string().nullable(),
	createdAt: z.string(),
	resolvedAt: z.string().nullable()
});
export type ProofComment = z.output<typeof ProofCommentSchema>;

export const ProofVerdictSchema = z.object({
	id: z.string(),
	reviewerId: z.string(),
	reviewerName: z.string(),
	verdict: z.enum(['approve', 'changes']),
	note: z.string(),
	createdAt: z.string()
});
export type ProofVerdict = z.output<typeof ProofVerdictSchema>;

const When = z.union([z.date(), z.string()]);

/** A proof's header as the pages show it. */
export const ProofHeaderSchema = z.object({
	id: z.string(),
	number: z.int(),
	description: z.string(),
	createdAt: When,
	createdBy: z.string().nullable(),
	releasedAt: When.nullable(),
	releasedBy: z.string().nullable(),
	withdrawnAt: When.nullable(),
	withdrawNote: z.string(),
	/** Released and not withdrawn. */
	released: z.boolean()
});
export type ProofHeader = z.output<typeof ProofHeaderSchema>;

/** The game a proof belongs to, as far as its pages need it. */
export const ProofGameSchema = z.object({ id: z.string(), name: z.string(), teamId: z.string() });
export type ProofGame = z.output<typeof ProofGameSchema>;
