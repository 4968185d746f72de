import { requireGame, requireGameRole, may } from '$lib/server/http/guard';
import { proofList } from '$lib/server/proofs';
import { db } from '$lib/server/runtime';
import { gameReadiness } from '$lib/server/readiness';

/**
 * The game's proofs, newest first, with their state and a summary of the verdicts and open
 * threads. Printers see the releases only: those still current and those withdrawn (so they
 * know not to print them), without the review.
 */
export const load = async ({ locals, params }) => {
	const d = await db();
	const { role } = await requireGameRole(d, locals, params.gameId, 'release.read');
	const reader = may(role, 'game.read');
	const proofs = await proofList(d, params.gameId, { review: reader, releasedOnly: !reader });
	return {
		proofs,
		/** Shown before cutting: what the proof will record. */
		readiness: may(role, 'proof.cut') ? await gameReadiness((await requireGame(d, locals, params.gameId, 'game.read')).doc) : [],
		printerView: !reader,
		can: { cut: may(role, 'proof.cut'), compare: reader }
	};
};
