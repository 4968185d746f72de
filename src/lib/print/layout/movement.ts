/**
 * Movement card front: the runner's colour band with its symbol and name, the step count large
 * and a row of chevrons (one per step) pointing the way the runners race.
 */
import type { MovementData } from '../../game/model';
import { chevronPath } from '../symbols';
import type { FaceContext } from './context';
import { drawCardName, drawStepsAndArt, type StepsParams } from './steps';
import { hex, type Box, type FaceBuilder } from './face-builder';
import { drawBand, drawFrame, drawGround, runnerColour } from './frame';
import type { FracBox } from './templates';

export interface MovementParams extends StepsParams {
	chevronBox: FracBox;
}

/** When a runner is missing from the game, draw the card neutral (and say so). */
export const UNKNOWN_RUNNER = { name: '?', colourHex: '#9aa09c', cmyk: { c: 0, m: 0, y: 0, k: 45 } } as const;

/** `count` chevrons centred in `box`, as many as fit at a legible size. */
export function drawChevrons(b: FaceBuilder, box: Box, count: number, direction: 'forward' | 'back', fillHex: string, strokeHex: string) {
	if (count <= 0) return;
	let h = box.hMm;
	let w = h * 0.62;
	let gap = w * 0.18;
	const total = () => count * w + (count - 1) * gap;
	if (total() > box.wMm) {
		const k = box.wMm / total();
		h *= k;
		w *= k;
		gap *= k;
	}
	let x = box.xMm + (box.wMm - total()) / 2 + w / 2;
	const cy = box.yMm + box.hMm / 2;
	for (let i = 0; i < count; i++, x += w + gap)
		b.add({ type: 'path', d: chevronPath(direction, x, cy, w, h), fill: hex(fillHex), stroke: hex(strokeHex), strokeMm: 0.3 }, 'chevrons');
}

export function drawMovement(ctx: FaceContext<MovementParams>, data: MovementData) {
	const { b, game, params: p } = ctx;
	const runner = game.runners.find((r) => r.id === data.runnerId);
	if (!runner) b.warn(`runner ${data.runnerId} is not in the game`);
	const r = runner ?? UNKNOWN_RUNNER;
	const colour = runnerColour(r);

	drawGround(b, p.backgroundHex);
	const { panel } = drawBand(b, p, {
		colour,
		symbol: runner?.symbol,
		title: p.show.runnerName ? r.name : '',
		titleLabel: 'runner name'
	});
	drawFrame(b, p, panel);

	const art = drawStepsAndArt(ctx, runner?.id, data.steps);
	if (!art && p.show.chevrons) drawChevrons(b, b.place(p.chevronBox), data.steps, 'forward', colour.hex, p.inkHex);
	drawCardName(ctx);
}
