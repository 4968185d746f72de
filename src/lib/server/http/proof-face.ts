/**
 * GET …/proofs/{proofId}/cards/{cardId}/face.svg and back.svg: a face as the proof froze it.
 * A proof never changes, so its faces are immutable: kept by the browser for a year, and here
 * (./face-cache.ts) by proof, card, side and guides.
 */
import type { RequestEvent } from '@sveltejs/kit';
import { requireProof } from './proof-access';
import { snapshotOf } from '../proofs';
import { renderFace, renderFaceTemplate, standaloneSvg, parseGuides } from '../faces';
import { db } from '../runtime';
import { etagOf, keepFace, keptFace, notModified } from '../face-cache';
import { ENGINE_SALT, hashOf } from '$lib/print/cache';
import type { Side } from '$lib/print/layout';
import { NotFound, Invalid } from '../refusals';
import { svgToPng } from '$lib/print/png';
import { diffFaces } from '$lib/print/face-diff';

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
		const { face: drawn, layout } = await renderFaceTemplate({ game, kind, card, side, guides });
		face = keepFace(key, { ...drawn, warnings: layout.warnings.length });
	}
	return new Response(await standaloneSvg(face), {
		headers: { 'content-type': 'image/svg+xml; charset=utf-8', 'x-paddock-warnings': String(face.warnings), etag, 'cache-control': IMMUTABLE }
	});
}

/** Faces for a pixel difference are drawn at this resolution: enough to see a changed glyph, small enough to draw at once. */
export const DIFF_DPI = 100;

/**
 * GET …/proofs/compare/diff.png?a=&b=&card=&side=front|back: the pixel difference of one card's
 * face in two proofs (../../print/face-diff.ts); the count of differing pixels in
 * `x-paddock-changed-pixels`. Both proofs are immutable, so the answer is too.
 */
export async function proofFaceDiff(event: RequestEvent<{ gameId: string }>) {
	const d = await db();
	const q = event.url.searchParams;
	const [a, b, cardId, side] = [q.get('a'), q.get('b'), q.get('card'), q.get('side') ?? 'front'];
	if (!a || !b || !cardId) throw new Invalid('Name two proofs and a card: ?a=1&b=2&card=<card id>&side=front');
	if (side !== 'front' && side !== 'back') throw new Invalid('side is front or back');
	const first = (await requireProof(d, event.locals, event.params.gameId, a, 'game.read')).proof;
	const second = (await requireProof(d, event.locals, event.params.gameId, b, 'game.read')).proof;
	const draw = async (proof: typeof first) => {
		const game = snapshotOf(proof);
		const card = game.cards.find((c) => c.id === cardId);
		if (!card) throw new NotFound(`No such card in proof ${proof.number}`);
		const kind = game.kinds.find((k) => k.id === card.kindId)!;
		const { svg } = await renderFace({ game, kind, card, side });
		return (await svgToPng(svg, { widthMm: kind.size.widthMm, dpi: DIFF_DPI, background: 'white' })).png;
	};
	const diff = await diffFaces(await draw(first), await draw(second));
	return new Response(new Uint8Array(diff.png), {
		headers: {
			'content-type': 'image/png',
			'cache-control': IMMUTABLE,
			'x-paddock-changed-pixels': String(diff.changedPixels),
			'x-paddock-total-pixels': String(diff.widthPx * diff.heightPx)
		}
	});
}
