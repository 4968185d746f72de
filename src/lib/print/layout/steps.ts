/**
 * What the movement and rogue fronts share: the large step count (beside the runner's art when
 * the card shows art) and the card's own name in small muted type at the foot.
 */
import type { FaceContext } from './context';
import { drawSlot, slotArt } from './context';
import { hex } from './face-builder';
import type { FrontParams } from './frame';
import type { FracBox } from './templates';

export interface StepsParams extends FrontParams {
	bodyPt: number;
	numberPt: number;
	numberMinPt: number;
	numberBox: FracBox;
	artBox: FracBox;
	numberBoxWithArt: FracBox;
	cardNameBox: FracBox;
}

/** Draws the art slot (when shown) and the step count; true when art was drawn. */
export function drawStepsAndArt(ctx: FaceContext<StepsParams>, runnerId: string | undefined, steps: number): boolean {
	const { b, params: p } = ctx;
	const art = p.show.art ? slotArt(ctx, runnerId) : undefined;
	if (art) drawSlot(ctx, b.place(p.artBox), art);
	b.text(String(steps), b.place(art ? p.numberBoxWithArt : p.numberBox), {
		maxPt: p.numberPt,
		minPt: p.numberMinPt,
		weight: 'bold',
		align: 'center',
		valign: 'middle',
		wrap: false,
		fill: hex(p.inkHex),
		label: 'step count'
	});
	return !!art;
}

export function drawCardName(ctx: FaceContext<StepsParams>) {
	const { b, card, params: p } = ctx;
	if (!p.show.cardName || !card) return;
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
