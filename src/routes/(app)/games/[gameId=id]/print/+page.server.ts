import { requireGame, requireGameRole, may } from '$lib/server/http/guard';
import { profilesOf, gamePressSummary } from '$lib/server/printer-profiles';
import { proofsOf, isReleased, snapshotOf } from '$lib/server/proofs';
import { db } from '$lib/server/runtime';

/** The print page: what to print (working copy or a proof), how (a printer profile or by hand). */
export const load = async ({ locals, params }) => {
	const d = await db();
	const { role, game } = await requireGameRole(d, locals, params.gameId, 'release.read');
	const readsWorking = may(role, 'game.read');
	/** Cards by name, for one card's press file. */
	const cardsOf = (g: { cards: { id: string; name: string }[] }) => g.cards.map((c) => ({ id: c.id, name: c.name }));
	const proofs = (await proofsOf(d, game.id, !readsWorking)).map((p) => ({
		id: p.id,
		number: p.number,
		description: p.description,
		released: isReleased(p),
		cards: cardsOf(snapshotOf(p))
	}));
	const working = readsWorking ? (await requireGame(d, locals, params.gameId, 'game.read')).doc : null;
	const kinds = working ? working.kinds.map((k) => ({ id: k.id, name: k.name, widthMm: k.size.widthMm, heightMm: k.size.heightMm })) : [];
	return {
		readsWorking,
		proofs,
		kinds,
		cards: working ? cardsOf(working) : [],
		profiles: await profilesOf(d, game.teamId),
		press: await gamePressSummary(d, game.teamId, game.pressProfileId),
		mayEditProfiles: may(role, 'profile.edit')
	};
};
