import { error } from '@sveltejs/kit';
import { requireGameRole } from '$lib/server/http/guard';
import { loadGame } from '$lib/server/game-store';
import { db } from '$lib/server/runtime';
import { exportCardsCsv } from '$lib/game/csv';

/**
 * A spreadsheet reads a UTF-8 file without guessing its encoding when it starts with a byte-order
 * mark (common practice); the importer takes the mark off again.
 */
const BOM = '\uFEFF';

/** GET …/kinds/{kindId}/cards.csv: the kind's cards as CSV, runners and money tables by name. */
export const GET = async ({ locals, params }) => {
	const d = await db();
	const { game: row } = await requireGameRole(d, locals, params.gameId, 'game.read');
	const game = await loadGame(d, params.gameId);
	const kind = game.kinds.find((k) => k.id === params.kindId);
	if (!kind) error(404, 'No such card kind');
	const csv = exportCardsCsv(kind, game.cards, { runners: game.runners, moneyTables: game.moneyTables });
	const name = `${row.slug}-${kind.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'cards'}.csv`;
	return new Response(BOM + csv, {
		headers: {
			// text/csv with its optional header parameter: RFC 4180 §3.
			'content-type': 'text/csv; charset=utf-8; header=present',
			// RFC 6266: an ASCII file name (the slug is ASCII already).
			'content-disposition': `attachment; filename="${name}"`,
			'cache-control': 'private, no-cache'
		}
	});
};
