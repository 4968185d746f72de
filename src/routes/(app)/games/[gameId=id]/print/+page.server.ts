import { requireGame, requireGameRole, may } from '$lib/server/guard';
import { profilesOf, gamePressSummary } from '$lib/server/printer-profiles';
import { proofsOf, isReleased } from '$lib/server/proofs';
import { db } from '$lib/server/runtime';

/** The print page: what to print (working copy or a proof), how (a printer profile or by hand). */
export const load = async ({ locals, params }) => {
	const d = await db();
	const { role, game } = await requireGameRole(d, locals, params.gameId, 'release.read');
	const readsWorking = may(role, 'game.read');
	const proofs = (await proofsOf(d, game.id, !readsWorking)).map((p) => ({
		id: p.id,
		number: p.number,
		description: p.description,
		released: isReleased(p)
	}));
	const kinds = readsWorking
		? (await requireGame(d, locals, params.gameId, 'game.read')).doc.kinds.map((k) => ({ id: k.id, name: k.name, widthMm: k.size.widthMm, heightMm: k.size.heightMm }))
		: [];
	return {
		readsWorking,
		proofs,
		kinds,
		profiles: await profilesOf(d, game.teamId),
		press: await gamePressSummary(d, game.teamId, game.pressProfileId),
		mayEditProfiles: may(role, 'profile.edit')
	};
};
