import { redirect } from '@sveltejs/kit';
import { requireGame, requireGameRole, may } from '$lib/server/http/guard';
import { duplicateGame } from '$lib/server/game-lifecycle';
import { checkDeck } from '$lib/game/deck-check';
import { gameReadiness } from '$lib/server/readiness';
import { db } from '$lib/server/runtime';

/** The overview: what the game holds, the deck check per player count, export and import. */
export const load = async ({ locals, params }) => {
	const d = await db();
	const { role } = await requireGameRole(d, locals, params.gameId, 'release.read');
	if (role === 'printer') return { printerOnly: true as const };
	const { doc: game } = await requireGame(d, locals, params.gameId, 'game.read');
	const deck = checkDeck(game);
	return {
		printerOnly: false as const,
		counts: {
			runners: game.runners.length,
			moneyTables: game.moneyTables.length,
			kinds: game.kinds.length,
			art: game.art.length
		},
		rogue: game.rogueRunner?.name ?? null,
		readiness: await gameReadiness(game),
		deck,
		may: { duplicate: may(role, 'game.create'), delete: may(role, 'game.delete') }
	};
};

export const actions = {
	/** One click: a new game with its own copy of this one's data and art, opened at once. */
	duplicate: async ({ locals, params }) => {
		const d = await db();
		const { actor } = await requireGameRole(d, locals, params.gameId, 'game.create');
		const copy = await duplicateGame(d, actor);
		redirect(303, `/games/${copy.id}`);
	}
};
