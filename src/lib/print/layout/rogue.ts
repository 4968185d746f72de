/**
 * Rogue card front: the wrong-way runner's striped band, its symbol and name, the step count and
 * a large arrow pointing backwards (against the chevrons of ordinary movement cards).
 */
import type { RogueData } from '../../game/model';
import { arrowPath } from '../symbols';
import type { FaceContext } from './context';
import { drawSlot, slotArt } from './context';
import { hex } from './face-builder';
import { drawBand, drawFrame, drawGround, runnerColour, type FrontParams } from './frame';
import { UNKNOWN_RUNNER } from './movement';
import type { FracBox } from './templates';

export interface RogueParams extends FrontParams {
	bodyPt: number;
	numberPt: number;
	numberMinPt: number;
	stripeMm: number;
	caption: string;
	numberBox: FracBox;
	arrowBox: FracBox;
	captionBox: FracBox;
	artBox: FracBox;
	numberBoxWithArt: FracBox;
	arrowBoxWithArt: FracBox;
	cardNameBox: FracBox;
}

export function drawRogue(ctx: FaceContext<RogueParams>, data: RogueData) {
	const { b, game, card, params: p } = ctx;
	const rogue = game.rogueRunner;
	if (!rogue) b.warn('the game has no rogue runner');
	const r = rogue ?? UNKNOWN_RUNNER;
	const colour = runnerColour(r);

	drawGround(b, p.backgroundHex);
	const { panel } = drawBand(b, p, {
		colour,
		symbol: rogue?.symbol,
		title: p.show.runnerName ? r.name : '',
		titleLabel: 'rogue runner name',
		stripes: p.show.stripes ? { periodMm: p.stripeMm } : undefined
	});
	drawFrame(b, p, panel);

	const art = p.show.art ? slotArt(ctx, rogue?.id) : undefined;
	if (art) drawSlot(ctx, b.place(p.artBox), art);
	b.text(String(data.steps), b.place(art ? p.numberBoxWithArt : p.numberBox), {
		maxPt: p.numberPt,
		minPt: p.numberMinPt,
		weight: 'bold',
		align: 'center',
		valign: 'middle',
		wrap: false,
		fill: hex(p.inkHex),
		label: 'step count'
	});
	if (p.show.arrow) {
		const box = b.place(art ? p.arrowBoxWithArt : p.arrowBox);
		const lengthMm = Math.min(box.wMm, box.hMm * 3.2);
		b.add(
			{
				type: 'path',
				d: arrowPath('back', box.xMm + box.wMm / 2, box.yMm + box.hMm / 2, lengthMm, box.hMm),
				fill: colour,
				stroke: hex(p.inkHex),
				strokeMm: 0.4
			},
			'backward arrow'
		);
	}
	if (!art && p.show.caption && p.caption)
		b.text(p.caption, b.place(p.captionBox), {
			maxPt: 9,
			minPt: 5,
			weight: 'bold',
			align: 'center',
			valign: 'middle',
			wrap: false,
			ellipsis: true,
			fill: hex(p.inkHex),
			label: 'caption'
		});
	if (p.show.cardName && card)
		b.text(card.name, b.place(p.cardNameBox), {
			maxPt: p.bodyPt,
			minPt: 5,
			align: 'center',
			valign: 'middle',
			wrap: false,
			ellipsis: true,
			fill: hex(p.mutedHex),
			label: 'card name'
		});
}
