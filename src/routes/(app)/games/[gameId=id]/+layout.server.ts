import { requireGameRole, may } from '$lib/server/http/guard';
import { db } from '$lib/server/runtime';

/** Every game page: who you are in this game's team and what you may do. */
export const load = async ({ locals, params }) => {
	const { role, game } = await requireGameRole(await db(), locals, params.gameId, 'release.read');
	return {
		role,
		can: {
			read: may(role, 'game.read'),
			edit: may(role, 'game.edit'),
			art: may(role, 'art.edit'),
			cut: may(role, 'proof.cut')
		},
		game: {
			id: game.id,
			name: game.name,
			slug: game.slug,
			teamId: game.teamId,
			bleedStandard: game.bleedStandard,
			defaultCardSize: game.defaultCardSize,
			version: game.version
		}
	};
};
