/**
 * GET …/cards/{cardId}/face.svg and back.svg: one face of a saved card as a standalone SVG.
 * Kept by the hash of what the face is drawn from (./face-cache.ts), with that hash as ETag: a
 * repeat request revalidates to 304, and an unchanged game is not even read again.
 */
import type { RequestEvent } from '@sveltejs/kit';
import { requireGameRole } from './guard';
import { loadGame } from '../game-store';
import { renderFaceTemplate, standaloneSvg, parseGuides } from '../faces';
import { db } from '../runtime';
import { etagOf, faceContentKey, keepFace, keptFace, knownKey, notModified, rememberKey, type KeptFace } from '../face-cache';
import type { Side } from '$lib/print/layout';
import { NotFound } from '../refusals';

export async function cardFaceSvg(event: RequestEvent<{ gameId: string; cardId: string }>, side: Side) {
	const d = await db();
	const { game: row } = await requireGameRole(d, event.locals, event.params.gameId, 'game.read');
	const guides = parseGuides(event.url.searchParams.get('guides'));
	const variant = `svg:${JSON.stringify(guides)}`;
	const versionKey = `${row.id}:${row.version}:${event.params.cardId}:${side}:${variant}`;

	let key = knownKey(versionKey);
	let face: KeptFace | undefined = key ? keptFace(key) : undefined;
	if (key && notModified(event.request, etagOf(key))) return unchanged(etagOf(key));
	if (!key || !face) {
		const game = await loadGame(d, event.params.gameId);
		const card = game.cards.find((c) => c.id === event.params.cardId);
		if (!card) throw new NotFound('No such card');
		const kind = game.kinds.find((k) => k.id === card.kindId)!;
		key = faceContentKey(game, kind, card, side, variant);
		rememberKey(versionKey, key);
		if (notModified(event.request, etagOf(key))) return unchanged(etagOf(key));
		face = keptFace(key);
		if (!face) {
			const { face: drawn, layout } = await renderFaceTemplate({ game, kind, card, side, guides });
			face = keepFace(key, { ...drawn, warnings: layout.warnings.length });
		}
	}
	return new Response(await standaloneSvg(face), {
		headers: {
			'content-type': 'image/svg+xml; charset=utf-8',
			'x-paddock-warnings': String(face.warnings),
			etag: etagOf(key),
			// Kept, but asked again each time: a 304 when nothing it depends on changed.
			'cache-control': 'private, no-cache'
		}
	});
}

function unchanged(etag: string) {
	return new Response(null, { status: 304, headers: { etag, 'cache-control': 'private, no-cache' } });
}
