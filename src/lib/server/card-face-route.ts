/** GET …/cards/{cardId}/face.svg and back.svg: one face of a saved card as a standalone SVG. */
import type { RequestEvent } from '@sveltejs/kit';
import { ApiError } from './api';
import { requireGameRole } from './guard';
import { loadGame } from './game-store';
import { renderFace, parseGuides } from './faces';
import { db } from './runtime';
import type { Side } from '$lib/print/layout';

export async function cardFaceSvg(event: RequestEvent<{ gameId: string; cardId: string }>, side: Side) {
	const d = await db();
	await requireGameRole(d, event.locals, event.params.gameId, 'game.read');
	const game = await loadGame(d, event.params.gameId);
	const card = game.cards.find((c) => c.id === event.params.cardId);
	if (!card) throw new ApiError(404, 'No such card');
	const kind = game.kinds.find((k) => k.id === card.kindId)!;
	const { svg, layout } = await renderFace({
		game,
		kind,
		card,
		side,
		guides: parseGuides(event.url.searchParams.get('guides'))
	});
	return new Response(svg, {
		headers: {
			'content-type': 'image/svg+xml; charset=utf-8',
			'x-paddock-warnings': String(layout.warnings.length),
			'cache-control': 'private, no-cache'
		}
	});
}
