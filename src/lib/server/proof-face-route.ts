/** GET …/proofs/{proofId}/cards/{cardId}/face.svg and back.svg: a face as the proof froze it. */
import type { RequestEvent } from '@sveltejs/kit';
import { ApiError } from './api';
import { requireProof } from './proof-access';
import { snapshotOf } from './proofs';
import { renderFace, parseGuides } from './faces';
import { db } from './runtime';
import type { Side } from '$lib/print/layout';

export async function proofFaceSvg(event: RequestEvent<{ gameId: string; proofId: string; cardId: string }>, side: Side) {
	const d = await db();
	const { proof } = await requireProof(d, event.locals, event.params.gameId, event.params.proofId);
	const game = snapshotOf(proof);
	const card = game.cards.find((c) => c.id === event.params.cardId);
	if (!card) throw new ApiError(404, 'No such card in this proof');
	const kind = game.kinds.find((k) => k.id === card.kindId)!;
	const { svg } = await renderFace({ game, kind, card, side, guides: parseGuides(event.url.searchParams.get('guides')) });
	return new Response(svg, {
		headers: {
			'content-type': 'image/svg+xml; charset=utf-8',
			// A proof never changes: its faces can be kept.
			'cache-control': 'private, max-age=86400'
		}
	});
}
