/**
 * Rogue card front: the wrong-way runner's striped band, its symbol and name, the step count and
 * a large arrow pointing backwards (against the chevrons of ordinary movement cards).
 */
import type { RogueData } from '../../game/model';
import { arrowPath } from '../symbols';
import type { FaceContext } from './context';
import { drawCardName, drawStepsAndArt, type StepsParams } from './steps';
import { hex } from './face-builder';
import { drawBand, drawFrame, drawGround, runnerColour } from './frame';
import { UNKNOWN_RUNNER } from './movement';
import type { FracBox } from './templates';

export interface RogueParams extends StepsParams {
	stripeMm: number;
	caption: string;
	arrowBox: FracBox;
	captionBox: FracBox;
	arrowBoxWithArt: FracBox;
}

export function drawRogue(ctx: FaceContext<RogueParams>, data: RogueData) {
	const { b, game, params: p } = ctx;
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

	const art = drawStepsAndArt(ctx, rogue?.id, data.steps);
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
	drawCardName(ctx);
}
