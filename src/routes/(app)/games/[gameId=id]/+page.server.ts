import { requireGameRole, may } from '$lib/server/guard';
import { db } from '$lib/server/runtime';

export const load = async ({ locals, params }) => {
	const { role, game } = await requireGameRole(await db(), locals, params.gameId, 'release.read');
	return {
		role,
		mayRead: may(role, 'game.read'),
		game: { id: game.id, name: game.name, teamId: game.teamId, bleedStandard: game.bleedStandard, defaultCardSize: game.defaultCardSize }
	};
};
