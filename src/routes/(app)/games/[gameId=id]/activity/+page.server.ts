import { requireGame } from '$lib/server/http/guard';
import { activityOf } from '$lib/server/activity';
import { db } from '$lib/server/runtime';

/** Lines per page; older ones follow with ?before=. */
const PAGE = 200;

/** The game's activity log, newest first: who did what, and when. */
export const load = async ({ locals, params, url }) => {
	const d = await db();
	const { doc: game } = await requireGame(d, locals, params.gameId, 'game.read');
	const before = url.searchParams.get('before');
	const beforeDate = before && !Number.isNaN(Date.parse(before)) ? new Date(before) : null;
	const rows = await activityOf(d, params.gameId, { before: beforeDate, limit: PAGE + 1 });
	// Cards by the names they have now, for lines that name a card.
	const cardNames = Object.fromEntries(game.cards.map((c) => [c.id, c.name]));
	return {
		cardNames,
		entries: rows.slice(0, PAGE),
		older: rows.length > PAGE ? rows[PAGE - 1].createdAt.toISOString() : null,
		paged: !!beforeDate
	};
};
