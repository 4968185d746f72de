import { error } from '@sveltejs/kit';
import { requireGame } from '$lib/server/http/guard';
import { db } from '$lib/server/runtime';
import { cardSummary } from '$lib/game/card-rows';

/** Every face of the kind: the cards' fronts, and their backs (one shared back, or one per card). */
export const load = async ({ locals, params }) => {
	const d = await db();
	const { doc: game } = await requireGame(d, locals, params.gameId, 'game.read');
	const kind = game.kinds.find((k) => k.id === params.kindId);
	if (!kind) error(404, 'No such card kind');
	const cards = game.cards.filter((c) => c.kindId === kind.id);
	return {
		kind: { id: kind.id, name: kind.name, type: kind.type, size: kind.size, bleed: kind.bleed, backMode: kind.back.mode },
		// Each face's text alternative: the card's name and key values.
		cards: cards.map((c) => ({
			id: c.id,
			name: c.name,
			copies: c.copies,
			version: c.version ?? 0,
			summary: cardSummary(c, kind, { runners: game.runners, rogue: game.rogueRunner, moneyTables: game.moneyTables })
		})),
		printed: cards.reduce((n, c) => n + c.copies, 0),
		kindVersion: kind.version ?? 0
	};
};
