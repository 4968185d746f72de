/**
 * The shared back of a card kind: the ground, a lattice of the runner symbols (the game's own
 * marks) and a plaque with the game's name. A kind may put an art slot on its back instead.
 */
import { RUNNER_SYMBOLS } from '../symbols';
import type { FaceContext } from './context';
import { drawArtSlot, findArt, imageFor } from './art';
import { hex } from './face-builder';
import { fitTitle, verticalMetricsMm } from '../text';
import { drawGround } from './frame';
import { symbolLatticePath } from './pattern';
import type { FracBox } from './templates';

export interface BackParams extends Record<string, unknown> {
	backgroundHex: string;
	patternHex: string;
	inkHex: string;
	plaqueHex: string;
	accentHex: string;
	mutedHex: string;
	frameMm: number;
	cornerRadiusMm: number;
	panelRadiusMm: number;
	titlePt: number;
	titleMinPt: number;
	bodyPt: number;
	symbolMm: number;
	pitchMm: number;
	show: Record<string, boolean>;
	plaqueBox: FracBox;
}

export function drawBack(ctx: FaceContext<BackParams>) {
	const { b, game, kind, params: p } = ctx;
	drawGround(b, p.backgroundHex);
	const slot = kind.back.mode === 'shared' ? kind.back.artSlot : undefined;
	if (slot && p.show.art) {
		const art = findArt(game, kind, undefined, undefined, slot);
		// Back art runs to the bleed edge; it is decoration, the plaque carries the words.
		drawArtSlot(b, b.face, slot, art, imageFor(art, ctx.images), {
			radiusMm: 0,
			tintHex: p.patternHex,
			lineHex: p.plaqueHex,
			inkHex: p.inkHex
		}, false);
	} else if (p.show.pattern) {
		// The game's own runners' symbols when it has them, else all of ours.
		const used = [...new Set(game.runners.map((r) => r.symbol))];
		b.decor({
			type: 'path',
			d: symbolLatticePath(b.face, p.symbolMm, p.pitchMm, used.length >= 2 ? used : RUNNER_SYMBOLS),
			fill: hex(p.patternHex)
		});
	}
	if (!p.show.plaque) return;
	// The plaque keeps the template's width and centre and grows to hold its words.
	const area = b.place(p.plaqueBox);
	const inset = Math.max(1.2, p.frameMm * 2.5);
	const pad = inset + 2;
	const innerW = area.wMm - 2 * pad;
	const kindLine = p.show.kindName ? kind.name : '';
	const kindMm = kindLine ? verticalBoxMm(b, p.bodyPt) : 0;
	const gapMm = kindLine ? 1 : 0;
	const titleOpts = {
		maxPt: p.titlePt,
		minPt: p.titleMinPt,
		weight: 'bold' as const,
		align: 'center' as const,
		valign: 'middle' as const,
		maxLines: 3,
		lineHeight: 1.1,
		fill: hex(p.inkHex),
		label: 'game name'
	};
	const roomMm = b.safe.hMm - 2 * pad - kindMm - gapMm;
	// As few lines as keep the name large; the chosen line count is then used to place it.
	const measured = fitTitle(b.fonts, game.name, { xMm: 0, yMm: 0, wMm: innerW, hMm: roomMm }, titleOpts);
	titleOpts.maxLines = measured.lines.length;
	titleOpts.maxPt = measured.sizePt;
	const h = 2 * pad + measured.heightMm + gapMm + kindMm;
	const box = { xMm: area.xMm, yMm: area.yMm + area.hMm / 2 - h / 2, wMm: area.wMm, hMm: h };
	b.add(
		{ type: 'rect', ...box, radiusMm: p.panelRadiusMm, fill: hex(p.plaqueHex), stroke: hex(p.accentHex), strokeMm: p.frameMm },
		'plaque'
	);
	b.decor({
		type: 'rect',
		xMm: box.xMm + inset,
		yMm: box.yMm + inset,
		wMm: box.wMm - 2 * inset,
		hMm: box.hMm - 2 * inset,
		radiusMm: Math.max(0, p.panelRadiusMm - inset / 2),
		stroke: hex(p.accentHex),
		strokeMm: 0.25
	});
	b.text(game.name, { xMm: box.xMm + pad, yMm: box.yMm + pad, wMm: innerW, hMm: measured.heightMm + 1e-6 }, titleOpts);
	if (kindLine)
		b.text(kindLine, { xMm: box.xMm + pad, yMm: box.yMm + pad + measured.heightMm + gapMm, wMm: innerW, hMm: kindMm + 1e-6 }, {
			maxPt: p.bodyPt,
			minPt: 5,
			align: 'center',
			valign: 'middle',
			wrap: false,
			ellipsis: true,
			fill: hex(p.mutedHex),
			label: 'kind name'
		});
}

/** Height of one line's box (ascent + descent) at `sizePt`. */
function verticalBoxMm(b: { fonts: FaceContext['b']['fonts'] }, sizePt: number) {
	const { ascentMm, descentMm } = verticalMetricsMm(b.fonts.regular.metrics, sizePt);
	return ascentMm + descentMm;
}
