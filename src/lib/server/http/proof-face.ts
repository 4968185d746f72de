/**
 * GET …/proofs/{proofId}/cards/{cardId}/face.svg and back.svg: a face as the proof froze it.
 * A proof never changes, so its faces are immutable: kept by the browser for a year, and here
 * (./face-cache.ts) by proof, card, side and guides.
 */
import type { RequestEvent } from '@sveltejs/kit';
import { requireProof } from './proof-access';
import { snapshotOf } from '../proofs';
import { renderFace, parseGuides } from '../faces';
import { db } from '../runtime';
import { etagOf, keepFace, keptFace, notModified } from '../face-cache';
import { ENGINE_SALT, hashOf } from '$lib/print/cache';
import type { Side } from '$lib/print/layout';
import { NotFound } from '../refusals';

const IMMUTABLE = 'private, max-age=31536000, immutable';

export async function proofFaceSvg(event: RequestEvent<{ gameId: string; proofId: string; cardId: string }>, side: Side) {
	const d = await db();
	const { proof } = await requireProof(d, event.locals, event.params.gameId, event.params.proofId);
	const guides = parseGuides(event.url.searchParams.get('guides'));
	const key = hashOf([ENGINE_SALT, 'proof', proof.id, event.params.cardId, side, guides]);
	const etag = etagOf(key);
	if (notModified(event.request, etag)) return new Response(null, { status: 304, headers: { etag, 'cache-control': IMMUTABLE } });
	let face = keptFace(key);
	if (!face) {
		const game = snapshotOf(proof);
		const card = game.cards.find((c) => c.id === event.params.cardId);
		if (!card) throw new NotFound('No such card in this proof');
		const kind = game.kinds.find((k) => k.id === card.kindId)!;
		const { svg, layout } = await renderFace({ game, kind, card, side, guides });
		face = keepFace(key, { svg, warnings: layout.warnings.length });
	}
	return new Response(face.svg, {
		headers: { 'content-type': 'image/svg+xml; charset=utf-8', 'x-paddock-warnings': String(face.warnings), etag, 'cache-control': IMMUTABLE }
	});
}
