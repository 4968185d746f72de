/**
 * Proofs and the review loop: cut a proof (an immutable snapshot of the game), pin comments on
 * its cards, reply and resolve, give verdicts, release it to printers or withdraw the release.
 * Everything is logged in the game's activity, and the people concerned are told by e-mail.
 */
import { gameReadiness } from './readiness';
import { and, asc, count, desc, eq, inArray, isNull, max, or } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from './db';
import {
	proofs,
	proofComments,
	proofVerdicts,
	mutes,
	memberships,
	users,
	games,
	type Role
} from './db/schema';
import { loadGame } from './game-store';
import { logActivity } from './activity';
import { sendMail } from './mail';
import { config } from './config';
import { GameSchema, bleedMm, type Game } from '$lib/game/model';
import { NotFound, Conflict, Invalid } from './refusals';
import type { Actor, GameActor } from './actor';

export type Proof = typeof proofs.$inferSelect;

export const CommentSchema = z.union([
	z.strictObject({
		cardId: z.string().min(1).max(160),
		side: z.enum(['front', 'back']).default('front'),
		xMm: z.number().finite(),
		yMm: z.number().finite(),
		body: z.string().trim().min(1, 'Write something in the comment').max(4000)
	}),
	z.strictObject({
		replyTo: z.string().uuid(),
		body: z.string().trim().min(1, 'Write something in the reply').max(4000)
	})
]);

export const VerdictSchema = z.strictObject({
	verdict: z.enum(['approve', 'changes']),
	note: z.string().trim().max(2000).default('')
});

export const CutSchema = z.strictObject({
	description: z.string().trim().min(1, 'Say what this proof is for').max(500)
});

export const WithdrawSchema = z.strictObject({ note: z.string().trim().max(2000).default('') });

const link = (path: string) => new URL(path, config.origin).toString();
export const proofPath = (gameId: string, number: number) => `/games/${gameId}/proofs/${number}`;

export const snapshotOf = (proof: Proof): Game => GameSchema.parse(proof.snapshot);
export const isReleased = (proof: Proof) => !!proof.releasedAt && !proof.withdrawnAt;

async function gameRow(db: Db, gameId: string) {
	const [game] = await db.select().from(games).where(eq(games.id, gameId));
	return game;
}

/** People of the game's team in the given roles who have not muted the game, minus `except`. */
async function audience(db: Db, gameId: string, roles: Role[], except?: string) {
	const game = await gameRow(db, gameId);
	const rows = await db
		.select({ id: users.id, email: users.email, role: memberships.role })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(eq(memberships.teamId, game.teamId));
	const muted = new Set(
		(await db.select({ userId: mutes.userId }).from(mutes).where(eq(mutes.gameId, gameId))).map((m) => m.userId)
	);
	return rows.filter((r) => roles.includes(r.role) && !muted.has(r.id) && r.id !== except);
}

async function tell(db: Db, gameId: string, recipients: { email: string }[], template: string, values: Record<string, string>) {
	const to = [...new Set(recipients.map((r) => r.email))];
	// One message per person: nobody sees who else was told.
	for (const address of to) await sendMail(address, template, values);
}

export async function cutProof(db: Db, actor: GameActor, { description }: { description: string }) {
	const input = { gameId: actor.gameId, userId: actor.userId, userName: actor.name, description };
	const proof = await db.transaction(async (tx) => {
		const t = tx as unknown as Db;
		const snapshot = await loadGame(t, input.gameId);
		const [game] = await tx.select().from(games).where(eq(games.id, input.gameId)).for('update');
		const [{ last }] = await tx.select({ last: max(proofs.number) }).from(proofs).where(eq(proofs.gameId, input.gameId));
		const [row] = await tx
			.insert(proofs)
			.values({
				gameId: input.gameId,
				number: (last ?? 0) + 1,
				description: input.description,
				snapshot: snapshot as unknown as Record<string, unknown>,
				readiness: (await gameReadiness(snapshot)).map(({ code, message }) => ({ code, message })),
				createdBy: input.userId
			})
			.returning();
		await logActivity(t, {
			teamId: game.teamId,
			gameId: input.gameId,
			userId: input.userId,
			action: 'proof.cut',
			detail: { number: row.number, description: input.description }
		});
		return { row, game };
	});
	await tell(db, input.gameId, await audience(db, input.gameId, ['reviewer'], input.userId), 'proof-ready', {
		number: String(proof.row.number),
		game: proof.game.name,
		author: input.userName,
		description: input.description,
		link: link(proofPath(input.gameId, proof.row.number))
	});
	return proof.row;
}

export async function proofsOf(db: Db, gameId: string, releasedOnly: boolean) {
	const rows = await db.select().from(proofs).where(eq(proofs.gameId, gameId)).orderBy(desc(proofs.number));
	return releasedOnly ? rows.filter(isReleased) : rows;
}

/** A proof of the game by id or number; printers find released ones only (others are 404 to them). */
export async function findProof(db: Db, gameId: string, key: { id?: string; number?: number }, releasedOnly: boolean) {
	const where = key.id
		? and(eq(proofs.gameId, gameId), eq(proofs.id, key.id))
		: and(eq(proofs.gameId, gameId), eq(proofs.number, key.number ?? -1));
	const [proof] = await db.select().from(proofs).where(where);
	if (!proof || (releasedOnly && !isReleased(proof))) throw new NotFound('No such proof');
	return proof;
}

/** A release a printer was told about and that has since been withdrawn (by number), or null. */
export async function withdrawnRelease(db: Db, gameId: string, key: string): Promise<Proof | null> {
	if (!/^\d{1,6}$/.test(key)) return null;
	try {
		const proof = await findProof(db, gameId, { number: Number(key) }, false);
		return proof.releasedAt && proof.withdrawnAt ? proof : null;
	} catch (e) {
		if (e instanceof NotFound) return null;
		throw e;
	}
}

export async function commentsOf(db: Db, proofId: string) {
	return db
		.select({
			id: proofComments.id,
			threadId: proofComments.threadId,
			cardId: proofComments.cardId,
			side: proofComments.side,
			xMm: proofComments.xMm,
			yMm: proofComments.yMm,
			body: proofComments.body,
			authorId: proofComments.authorId,
			authorName: users.name,
			createdAt: proofComments.createdAt,
			resolvedAt: proofComments.resolvedAt
		})
		.from(proofComments)
		.leftJoin(users, eq(users.id, proofComments.authorId))
		.where(eq(proofComments.proofId, proofId))
		.orderBy(asc(proofComments.createdAt));
}

export async function verdictsOf(db: Db, proofId: string) {
	const rows = await db
		.select({
			id: proofVerdicts.id,
			reviewerId: proofVerdicts.reviewerId,
			reviewerName: users.name,
			verdict: proofVerdicts.verdict,
			note: proofVerdicts.note,
			createdAt: proofVerdicts.createdAt
		})
		.from(proofVerdicts)
		.innerJoin(users, eq(users.id, proofVerdicts.reviewerId))
		.where(eq(proofVerdicts.proofId, proofId))
		.orderBy(asc(proofVerdicts.createdAt));
	// Each reviewer's latest verdict counts; earlier ones stay in the history.
	const latest = new Map<string, (typeof rows)[number]>();
	for (const r of rows) latest.set(r.reviewerId, r);
	return { history: rows, current: [...latest.values()] };
}

/**
 * The game's proofs for the proofs page, newest first: who cut and released each, and (with
 * `review`) each proof's current verdicts and open threads. Four queries, however many proofs.
 */
export async function proofList(db: Db, gameId: string, { review, releasedOnly }: { review: boolean; releasedOnly: boolean }) {
	const all = await proofsOf(db, gameId, false);
	const list = releasedOnly ? all.filter((p) => p.releasedAt) : all;
	const ids = list.map((p) => p.id);
	const people = [...new Set(list.flatMap((p) => [p.createdBy, p.releasedBy]).filter((id): id is string => !!id))];
	const [names, verdicts, open] = await Promise.all([
		people.length ? db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, people)) : [],
		review && ids.length
			? db
					.select({ proofId: proofVerdicts.proofId, reviewerId: proofVerdicts.reviewerId, name: users.name, verdict: proofVerdicts.verdict })
					.from(proofVerdicts)
					.innerJoin(users, eq(users.id, proofVerdicts.reviewerId))
					.where(inArray(proofVerdicts.proofId, ids))
					.orderBy(asc(proofVerdicts.createdAt))
			: [],
		review && ids.length
			? db
					.select({ proofId: proofComments.proofId, threads: count() })
					.from(proofComments)
					.where(and(inArray(proofComments.proofId, ids), isNull(proofComments.threadId), isNull(proofComments.resolvedAt)))
					.groupBy(proofComments.proofId)
			: []
	]);
	const nameOf = new Map(names.map((u) => [u.id, u.name]));
	// Each reviewer's latest verdict counts (as in verdictsOf).
	const current = new Map<string, Map<string, (typeof verdicts)[number]>>();
	for (const v of verdicts) {
		if (!current.has(v.proofId)) current.set(v.proofId, new Map());
		current.get(v.proofId)!.set(v.reviewerId, v);
	}
	const openThreads = new Map(open.map((o) => [o.proofId, Number(o.threads)]));
	return list.map((p) => ({
		id: p.id,
		number: p.number,
		description: p.description,
		createdAt: p.createdAt,
		createdBy: p.createdBy ? (nameOf.get(p.createdBy) ?? null) : null,
		releasedAt: p.releasedAt,
		releasedBy: p.releasedBy ? (nameOf.get(p.releasedBy) ?? null) : null,
		withdrawnAt: p.withdrawnAt,
		withdrawNote: p.withdrawNote ?? '',
		released: isReleased(p),
		review: review ? { verdicts: [...(current.get(p.id)?.values() ?? [])].map((v) => ({ name: v.name, verdict: v.verdict })), openThreads: openThreads.get(p.id) ?? 0 } : null
	}));
}

export async function addComment(db: Db, actor: Actor, { proof, comment: input }: { proof: Proof; comment: z.infer<typeof CommentSchema> }) {
	const author = { id: actor.userId, name: actor.name };
	if (proof.withdrawnAt) throw new Conflict('This proof is withdrawn; comment on a newer one.');
	const game = snapshotOf(proof);
	let values: typeof proofComments.$inferInsert;
	let thread: { id: string; cardId: string } | null = null;
	if ('replyTo' in input) {
		const [parent] = await db
			.select()
			.from(proofComments)
			.where(and(eq(proofComments.id, input.replyTo), eq(proofComments.proofId, proof.id)));
		if (!parent) throw new NotFound('No such comment to reply to');
		const rootId = parent.threadId ?? parent.id;
		thread = { id: rootId, cardId: parent.cardId };
		values = { proofId: proof.id, threadId: rootId, cardId: parent.cardId, side: parent.side, xMm: parent.xMm, yMm: parent.yMm, body: input.body, authorId: author.id };
	} else {
		const card = game.cards.find((c) => c.id === input.cardId);
		if (!card) throw new Invalid('That card is not in this proof');
		const kind = game.kinds.find((k) => k.id === card.kindId)!;
		const bleed = bleedMm(kind.bleed);
		const w = kind.size.widthMm + 2 * bleed;
		const h = kind.size.heightMm + 2 * bleed;
		if (input.xMm < 0 || input.yMm < 0 || input.xMm > w || input.yMm > h) {
			throw new Invalid(`The pin is outside the card: the face is ${w.toFixed(2)} × ${h.toFixed(2)} mm with bleed.`);
		}
		values = { proofId: proof.id, cardId: card.id, side: input.side, xMm: input.xMm, yMm: input.yMm, body: input.body, authorId: author.id };
	}
	const [row] = await db.insert(proofComments).values(values).returning();
	const g = await gameRow(db, proof.gameId);
	await logActivity(db, {
		teamId: g.teamId,
		gameId: proof.gameId,
		userId: author.id,
		action: thread ? 'comment.replied' : 'comment.pinned',
		detail: { proof: proof.number, cardId: row.cardId, commentId: row.id }
	});
	// The designers, and whoever is in the thread (unless they muted the game).
	const designers = await audience(db, proof.gameId, ['owner', 'designer'], author.id);
	let inThread: { email: string }[] = [];
	if (thread) {
		const root = thread.id;
		const authors = new Set(
			(
				await db
					.select({ authorId: proofComments.authorId })
					.from(proofComments)
					.where(or(eq(proofComments.id, root), eq(proofComments.threadId, root)))
			).map((r) => r.authorId)
		);
		const everyone = await audience(db, proof.gameId, ['owner', 'designer', 'artist', 'reviewer', 'printer'], author.id);
		inThread = everyone.filter((p) => authors.has(p.id));
	}
	const cardName = game.cards.find((c) => c.id === row.cardId)?.name ?? row.cardId;
	await tell(db, proof.gameId, [...designers, ...inThread], 'comment', {
		author: author.name,
		number: String(proof.number),
		game: g.name,
		card: `“${cardName}” (${row.side})`,
		body: row.body,
		link: link(`${proofPath(proof.gameId, proof.number)}?comment=${thread?.id ?? row.id}`)
	});
	return row;
}

export async function resolveComment(db: Db, actor: Actor, { proof, commentId }: { proof: Proof; commentId: string }) {
	const { userId } = actor;
	const [row] = await db
		.update(proofComments)
		.set({ resolvedAt: new Date(), resolvedBy: userId })
		.where(and(eq(proofComments.id, commentId), eq(proofComments.proofId, proof.id), isNull(proofComments.threadId), isNull(proofComments.resolvedAt)))
		.returning();
	if (!row) {
		const [any] = await db.select().from(proofComments).where(and(eq(proofComments.id, commentId), eq(proofComments.proofId, proof.id)));
		if (!any) throw new NotFound('No such comment');
		if (any.threadId) throw new Invalid('Resolve the thread from its first comment');
		throw new Conflict('This comment is resolved already');
	}
	const g = await gameRow(db, proof.gameId);
	await logActivity(db, { teamId: g.teamId, gameId: proof.gameId, userId, action: 'comment.resolved', detail: { proof: proof.number, commentId } });
	return row;
}

export async function giveVerdict(db: Db, actor: Actor, { proof, ...input }: { proof: Proof } & z.infer<typeof VerdictSchema>) {
	const reviewer = { id: actor.userId, name: actor.name };
	if (proof.withdrawnAt) throw new Conflict('This proof is withdrawn; a verdict on it no longer counts.');
	const [row] = await db.insert(proofVerdicts).values({ proofId: proof.id, reviewerId: reviewer.id, verdict: input.verdict, note: input.note }).returning();
	const g = await gameRow(db, proof.gameId);
	await logActivity(db, { teamId: g.teamId, gameId: proof.gameId, userId: reviewer.id, action: 'proof.verdict', detail: { proof: proof.number, verdict: input.verdict } });
	await tell(db, proof.gameId, await audience(db, proof.gameId, ['owner', 'designer'], reviewer.id), 'verdict', {
		author: reviewer.name,
		verdict: input.verdict === 'approve' ? 'approve' : 'changes needed',
		number: String(proof.number),
		game: g.name,
		note: input.note || '(no note)',
		link: link(proofPath(proof.gameId, proof.number))
	});
	return row;
}

export async function releaseProof(db: Db, actor: Actor, { proof }: { proof: Proof }) {
	const by = { id: actor.userId, name: actor.name };
	if (proof.withdrawnAt) throw new Conflict('A withdrawn release cannot be released again; cut a new proof.');
	if (proof.releasedAt) throw new Conflict('This proof is released already.');
	const [row] = await db.update(proofs).set({ releasedAt: new Date(), releasedBy: by.id }).where(eq(proofs.id, proof.id)).returning();
	const g = await gameRow(db, proof.gameId);
	await logActivity(db, { teamId: g.teamId, gameId: proof.gameId, userId: by.id, action: 'proof.released', detail: { proof: proof.number } });
	await tell(db, proof.gameId, await audience(db, proof.gameId, ['printer'], by.id), 'release', {
		author: by.name,
		number: String(proof.number),
		game: g.name,
		description: proof.description,
		link: link(proofPath(proof.gameId, proof.number))
	});
	return row;
}

export async function withdrawProof(db: Db, actor: Actor, { proof, note }: { proof: Proof; note: string }) {
	const by = { id: actor.userId, name: actor.name };
	if (!proof.releasedAt) throw new Conflict('Only a released proof can be withdrawn.');
	if (proof.withdrawnAt) throw new Conflict('This release is withdrawn already.');
	const [row] = await db
		.update(proofs)
		.set({ withdrawnAt: new Date(), withdrawnBy: by.id, withdrawNote: note })
		.where(eq(proofs.id, proof.id))
		.returning();
	const g = await gameRow(db, proof.gameId);
	await logActivity(db, { teamId: g.teamId, gameId: proof.gameId, userId: by.id, action: 'proof.withdrawn', detail: { proof: proof.number, note } });
	await tell(db, proof.gameId, await audience(db, proof.gameId, ['printer'], by.id), 'withdrawal', {
		author: by.name,
		number: String(proof.number),
		game: g.name,
		note: note || '(no reason given)',
		link: link(`/games/${proof.gameId}/proofs`)
	});
	return row;
}

export async function setMuted(db: Db, actor: GameActor, { muted }: { muted: boolean }) {
	const { userId, gameId } = actor;
	if (muted) await db.insert(mutes).values({ userId, gameId }).onConflictDoNothing();
	else await db.delete(mutes).where(and(eq(mutes.userId, userId), eq(mutes.gameId, gameId)));
}

export async function isMuted(db: Db, userId: string, gameId: string) {
	const [row] = await db.select().from(mutes).where(and(eq(mutes.userId, userId), eq(mutes.gameId, gameId)));
	return !!row;
}

