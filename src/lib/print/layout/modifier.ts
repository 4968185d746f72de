/**
 * Modifier card front: the token's name, its signed step count in a disc (the token's face) and
 * its effect in words.
 */
import type { ModifierData } from '../../game/model';
import type { FaceContext } from './context';
import { drawSlot, slotArt } from './context';
import { hex } from './face-builder';
import { drawBand, drawFrame, drawGround, type FrontParams } from './frame';
import type { FracBox } from './templates';
import { formatCoins } from './wager';

export interface ModifierParams extends FrontParams {
	accentHex: string;
	stepsPt: number;
	bodyPt: number;
	bodyMinPt: number;
	discBox: FracBox;
	effectBox: FracBox;
	artBox: FracBox;
	discBoxWithArt: FracBox;
	effectBoxWithArt: FracBox;
}

/** Steps with their sign (+2, −1, 0), written like coins. */
export const formatSteps = formatCoins;

export function drawModifier(ctx: FaceContext<ModifierParams>, data: ModifierData) {
	const { b, params: p } = ctx;
	drawGround(b, p.backgroundHex);
	const { panel } = drawBand(b, p, {
		colour: hex(p.accentHex),
		title: p.show.name ? data.name : '',
		titleLabel: 'modifier name'
	});
	drawFrame(b, p, panel);

	const art = p.show.art ? slotArt(ctx) : undefined;
	if (art) drawSlot(ctx, b.place(p.artBox), art);
	if (p.show.steps) {
		const box = b.place(art ? p.discBoxWithArt : p.discBox);
		const d = Math.min(box.wMm, box.hMm);
		const cx = box.xMm + box.wMm / 2;
		const cy = box.yMm + box.hMm / 2;
		const ring = Math.max(0.6, d * 0.035);
		b.add(
			{
				type: 'ellipse',
				cxMm: cx,
				cyMm: cy,
				rxMm: d / 2 - ring / 2,
				ryMm: d / 2 - ring / 2,
				fill: hex('#ffffff'),
				stroke: hex(p.accentHex),
				strokeMm: ring
			},
			'token disc'
		);
		const inner = d * 0.64;
		b.text(formatSteps(data.steps), { xMm: cx - inner / 2, yMm: cy - inner / 2, wMm: inner, hMm: inner }, {
			maxPt: p.stepsPt,
			minPt: 8,
			weight: 'bold',
			align: 'center',
			valign: 'middle',
			wrap: false,
			fill: hex(p.inkHex),
			label: 'signed steps'
		});
	}
	if (p.show.effect && data.effectText)
		b.text(data.effectText, b.place(art ? p.effectBoxWithArt : p.effectBox), {
			maxPt: p.bodyPt,
			minPt: p.bodyMinPt,
			align: 'center',
			valign: 'top',
			lineHeight: 1.25,
			ellipsis: true,
			fill: hex(p.inkHex),
			label: 'effect text'
		});
}
