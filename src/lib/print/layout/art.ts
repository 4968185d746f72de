/**
 * Art slots: find the artwork assigned to a slot and draw it cover-fitted and clipped to the
 * slot's box, or a placeholder frame while no art is there.
 */
import type { ImageAsset } from '../display-list';
import type { ArtAsset, Card, CardKind, Game } from '../../game/model';
import { FaceBuilder, hex, type Box } from './face-builder';

/**
 * The art for `slot`, most specific first: the card's own, then the runner's (its portrait on
 * every card of that runner), then the kind's.
 */
export function findArt(
	game: Pick<Game, 'art'>,
	kind: CardKind,
	card: Card | undefined,
	runnerId: string | undefined,
	slot: string
): ArtAsset | undefined {
	const match = (scope: 'card' | 'runner' | 'kind', targetId: string | undefined) =>
		targetId === undefined
			? undefined
			: game.art.find(
					(a) => a.assignment?.scope === scope && a.assignment.targetId === targetId && a.assignment.slot === slot
				);
	return match('card', card?.id) ?? match('runner', runnerId) ?? match('kind', kind.id);
}

/** The image for an art asset: the table is keyed by content hash (or, failing that, by art id). */
export function imageFor(art: ArtAsset | undefined, images: ReadonlyMap<string, ImageAsset> | undefined) {
	if (!art || !images) return undefined;
	return images.get(art.sha256) ?? images.get(art.id);
}

/** Scale the image to cover the box (no letterboxing), centred; the box clips the overhang. */
export function coverFit(box: Box, widthPx: number, heightPx: number): Box {
	const scale = Math.max(box.wMm / widthPx, box.hMm / heightPx);
	const wMm = widthPx * scale;
	const hMm = heightPx * scale;
	return { xMm: box.xMm + (box.wMm - wMm) / 2, yMm: box.yMm + (box.hMm - hMm) / 2, wMm, hMm };
}

export interface ArtSlotStyle {
	radiusMm: number;
	/** Placeholder colours. */
	tintHex: string;
	lineHex: string;
	inkHex: string;
}

/**
 * Draw the slot: the image when one is assigned and loaded, otherwise a placeholder (a tinted,
 * crossed frame naming the slot), so a proof shows where art is still missing.
 */
export function drawArtSlot(
	b: FaceBuilder,
	box: Box,
	slot: string,
	art: ArtAsset | undefined,
	image: ImageAsset | undefined,
	style: ArtSlotStyle,
	content = true
) {
	if (image) {
		const placed = coverFit(box, image.widthPx, image.heightPx);
		const item = {
			type: 'image' as const,
			...placed,
			imageId: image.id,
			radiusMm: style.radiusMm,
			clip: { ...box }
		};
		if (content) b.add(item, `art slot ${slot}`);
		else b.decor(item);
		return;
	}
	if (art) b.warn(`art “${art.fileName}” for slot ${slot} is not loaded; a placeholder is drawn`);
	b.decor({
		type: 'rect',
		...box,
		radiusMm: style.radiusMm,
		fill: hex(style.tintHex),
		stroke: hex(style.lineHex),
		strokeMm: 0.3
	});
	// Inset the cross so its ends stay inside the rounded corners.
	const i = Math.min(style.radiusMm * 0.3, box.wMm / 4, box.hMm / 4);
	const dash = [1.2, 1];
	for (const [x1, y1, x2, y2] of [
		[box.xMm + i, box.yMm + i, box.xMm + box.wMm - i, box.yMm + box.hMm - i],
		[box.xMm + box.wMm - i, box.yMm + i, box.xMm + i, box.yMm + box.hMm - i]
	])
		b.decor({ type: 'line', x1Mm: x1, y1Mm: y1, x2Mm: x2, y2Mm: y2, stroke: hex(style.lineHex), strokeMm: 0.25, dashMm: dash });
	const labelW = Math.min(box.wMm * 0.7, 40);
	const labelH = Math.min(box.hMm * 0.3, 7);
	const label: Box = {
		xMm: box.xMm + (box.wMm - labelW) / 2,
		yMm: box.yMm + (box.hMm - labelH) / 2,
		wMm: labelW,
		hMm: labelH
	};
	b.decor({ type: 'rect', ...label, radiusMm: labelH / 2, fill: hex(style.tintHex) });
	b.text(`art: ${slot}`, { ...label, xMm: label.xMm + 1, wMm: label.wMm - 2 }, {
		maxPt: 7,
		minPt: 4,
		align: 'center',
		valign: 'middle',
		wrap: false,
		ellipsis: true,
		fill: hex(style.inkHex),
		label: `placeholder for art slot ${slot}`
	});
}
