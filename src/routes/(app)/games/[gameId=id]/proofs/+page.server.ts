import { inArray } from 'drizzle-orm';
import { requireGameRole, may } from '$lib/server/guard';
import { proofsOf, verdictsOf, commentsOf, isReleased } from '$lib/server/proofs';
import { users } from '$lib/server/db/schema';
import { db } from '$lib/server/runtime';
import { loadGame } from '$lib/server/game-store';
import { readiness } from '$lib/game/readiness';

/**
 * The game's proofs, newest first, with their state and a summary of the verdicts and open
 * threads. Printers see the releases only: those still current and those withdrawn (so they
 * know not to print them), without the review.
 */
export const load = async ({ locals, params }) => {
	const d = await db();
	const { role } = await requireGameRole(d, locals, params.gameId, 'release.read');
	const reader = may(role, 'game.read');
	const all = await proofsOf(d, params.gameId, false);
	const list = reader ? all : all.filter((p) => p.releasedAt);
	const ids = [...new Set(list.flatMap((p) => [p.createdBy, p.releasedBy]).filter((id): id is string => !!id))];
	const names = new Map(
		ids.length ? (await d.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, ids))).map((u) => [u.id, u.name]) : []
	);
	const proofs = await Promise.all(
		list.map(async (p) => {
			const review = reader
				? {
						verdicts: (await verdictsOf(d, p.id)).current.map((v) => ({ name: v.reviewerName, verdict: v.verdict })),
						openThreads: (await commentsOf(d, p.id)).filter((c) => !c.threadId && !c.resolvedAt).length
					}
				: null;
			return {
				id: p.id,
				number: p.number,
				description: p.description,
				createdAt: p.createdAt,
				createdBy: p.createdBy ? (names.get(p.createdBy) ?? null) : null,
				releasedAt: p.releasedAt,
				releasedBy: p.releasedBy ? (names.get(p.releasedBy) ?? null) : null,
				withdrawnAt: p.withdrawnAt,
				withdrawNote: p.withdrawNote ?? '',
				released: isReleased(p),
				review
			};
		})
	);
	return {
		proofs,
		/** Shown before cutting: what the proof will record. */
		readiness: may(role, 'proof.cut') ? readiness(await loadGame(d, params.gameId)) : [],
		printerView: !reader,
		can: { cut: may(role, 'proof.cut'), compare: reader }
	};
};
