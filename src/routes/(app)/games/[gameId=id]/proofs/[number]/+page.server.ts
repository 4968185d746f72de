import { requireGameRole, may } from '$lib/server/http/guard';
import { isMuted, snapshotOf, isReleased, withdrawnRelease, proofsOf } from '$lib/server/proofs';
import { userName } from '$lib/server/users';
import { db } from '$lib/server/runtime';
import { proofForPage, cardsOf, kindsOf, changesSince } from '$lib/server/http/proof-pages';
import { pricesAtProof } from '$lib/server/odds';

/**
 * The frame of a proof: its header and its cards with their face boxes. Comments and verdicts
 * are fetched (and polled) by the page from the API. Printers get the release page instead.
 */
export const load = async ({ locals, params }) => {
	const d = await db();
	const { role, user } = await requireGameRole(d, locals, params.gameId, 'release.read');
	if (role === 'printer') {
		const gone = await withdrawnRelease(d, params.gameId, params.number);
		if (gone) {
			return {
				view: 'withdrawn' as const,
				proof: { id: gone.id, number: gone.number, description: gone.description, releasedAt: gone.releasedAt, withdrawnAt: gone.withdrawnAt, withdrawNote: gone.withdrawNote ?? '' }
			};
		}
	}
	const { proof } = await proofForPage(d, locals, params.gameId, params.number);
	const snapshot = snapshotOf(proof);
	const cards = cardsOf(snapshot);
	const header = {
		id: proof.id,
		number: proof.number,
		description: proof.description,
		createdAt: proof.createdAt,
		createdBy: await userName(d, proof.createdBy),
		releasedAt: proof.releasedAt,
		releasedBy: await userName(d, proof.releasedBy),
		withdrawnAt: proof.withdrawnAt,
		withdrawNote: proof.withdrawNote ?? '',
		released: isReleased(proof)
	};
	const muted = await isMuted(d, user.id, params.gameId);
	if (role === 'printer') return { view: 'release' as const, proof: header, cards, muted };
	// The proof cut just before this one (withdrawn or not): what "changed since the last proof" compares with.
	const previous = (await proofsOf(d, params.gameId, false)).find((p) => p.number < proof.number);
	return {
		view: 'viewer' as const,
		proof: header,
		cards,
		kinds: kindsOf(cards),
		previous: previous ? { number: previous.number, changes: changesSince(snapshotOf(previous), snapshot) } : null,
		readiness: proof.readiness,
		// Streamed: the page shows the proof at once and the prices when the races are done.
		wagerPrices: pricesAtProof(proof.id, snapshot),
		me: user.id,
		muted,
		can: {
			comment: may(role, 'proof.comment'),
			verdict: may(role, 'proof.verdict'),
			release: may(role, 'proof.release')
		}
	};
};
