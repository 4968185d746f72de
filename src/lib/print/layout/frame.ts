/**
 * What most fronts share: the paper ground, the coloured band across the top (runner colour,
 * symbol disc, title, optional badge) and the thin frame around the panel below it.
 */
import type { Colour } from '../display-list';
import { cmykFractions, type RogueRunner } from '../../game/model';
import { symbolPath, type RunnerSymbol } from '../symbols';
import { readableOn, shade } from './contrast';
import { FaceBuilder, hex, type Box } from './face-builder';
import { stripesPath } from './pattern';

/** Parameters every front template carries (templates/cards/*.json). */
export interface FrontParams extends Record<string, unknown> {
	backgroundHex: string;
	inkHex: string;
	mutedHex: string;
	lightInkHex: string;
	frameHex: string;
	frameMm: number;
	cornerRadiusMm: number;
	panelRadiusMm: number;
	titlePt: number;
	titleMinPt: number;
	bandFrac: number;
	show: Record<string, boolean>;
}

/** Gap between the band and the panel below it. */
const BAND_GAP_MM = 2;

export function drawGround(b: FaceBuilder, backgroundHex: string) {
	b.decor({ type: 'rect', ...b.face, fill: hex(backgroundHex) });
}

export interface BandSpec {
	colour: Colour;
	title: string;
	titleLabel: string;
	/** Drawn in a paper disc at the left: the runner's symbol. */
	symbol?: RunnerSymbol;
	/** A round badge at the right, e.g. a wager's tier. */
	badge?: { text: string; caption: string };
	/** Diagonal stripes over the band (marks the wrong-way runner). */
	stripes?: { periodMm: number };
}

export interface BandResult {
	/** Where the band ends (face mm). */
	bottomMm: number;
	/** The panel under the band, inside the safe area. */
	panel: Box;
}

/** The band runs from the top bleed edge to `bandFrac` of the safe area's height. */
export function drawBand(b: FaceBuilder, p: FrontParams, spec: BandSpec): BandResult {
	const safe = b.safe;
	const bottomMm = safe.yMm + p.bandFrac * safe.hMm;
	const band: Box = { xMm: 0, yMm: 0, wMm: b.face.wMm, hMm: bottomMm };
	b.decor({ type: 'rect', ...band, fill: spec.colour });
	if (spec.stripes)
		b.decor({
			type: 'path',
			d: stripesPath(band, spec.stripes.periodMm * 2, spec.stripes.periodMm),
			fill: hex(shade(spec.colour.hex, 0.18))
		});
	const titleInk = readableOn(spec.colour.hex, p.inkHex, p.lightInkHex);
	const inner: Box = { xMm: safe.xMm, yMm: safe.yMm, wMm: safe.wMm, hMm: bottomMm - BAND_GAP_MM - safe.yMm };
	// With a badge as well as a disc, both shrink so the title keeps room on narrow cards.
	const discMm = Math.min(inner.hMm, 15, safe.wMm * (spec.badge && spec.symbol ? 0.22 : 0.28));
	const cy = inner.yMm + inner.hMm / 2;
	let left = inner.xMm;
	let right = inner.xMm + inner.wMm;
	if (spec.symbol) {
		const cx = inner.xMm + discMm / 2;
		b.add(
			{ type: 'ellipse', cxMm: cx, cyMm: cy, rxMm: discMm / 2, ryMm: discMm / 2, fill: hex(p.backgroundHex) },
			'runner disc'
		);
		b.add({ type: 'path', d: symbolPath(spec.symbol, cx, cy, discMm * 0.56), fill: hex(p.inkHex) }, 'runner symbol');
		left += discMm + 2;
	}
	if (spec.badge) {
		const cx = right - discMm / 2;
		b.add(
			{
				type: 'ellipse',
				cxMm: cx,
				cyMm: cy,
				rxMm: discMm / 2,
				ryMm: discMm / 2,
				fill: hex(p.backgroundHex)
			},
			'badge'
		);
		const w = discMm * 0.72;
		b.text(spec.badge.text, { xMm: cx - w / 2, yMm: cy - discMm * 0.38, wMm: w, hMm: discMm * 0.47 }, {
			maxPt: 20,
			minPt: 6,
			weight: 'bold',
			align: 'center',
			valign: 'bottom',
			wrap: false,
			fill: hex(p.inkHex),
			label: 'badge'
		});
		b.text(spec.badge.caption, { xMm: cx - w / 2, yMm: cy + discMm * 0.09, wMm: w, hMm: discMm * 0.3 }, {
			maxPt: 6,
			minPt: 4,
			align: 'center',
			valign: 'top',
			wrap: false,
			fill: hex(p.mutedHex),
			label: 'badge caption'
		});
		right -= discMm + 2;
	}
	if (spec.title)
		b.text(spec.title, { xMm: left, yMm: inner.yMm, wMm: right - left, hMm: inner.hMm }, {
			maxPt: p.titlePt,
			minPt: p.titleMinPt,
			weight: 'bold',
			align: spec.symbol ? 'left' : 'center',
			valign: 'middle',
			maxLines: 2,
			lineHeight: 1.1,
			fill: hex(titleInk),
			label: spec.titleLabel
		});
	const panelTop = bottomMm + BAND_GAP_MM;
	return {
		bottomMm,
		panel: { xMm: safe.xMm, yMm: panelTop, wMm: safe.wMm, hMm: safe.yMm + safe.hMm - panelTop }
	};
}

/** A thin rounded outline around a panel, drawn inside it (its stroke never leaves the box). */
export function drawFrame(b: FaceBuilder, p: FrontParams, panel: Box) {
	if (!p.show.frame || p.frameMm <= 0) return;
	const s = p.frameMm;
	b.decor({
		type: 'rect',
		xMm: panel.xMm + s / 2,
		yMm: panel.yMm + s / 2,
		wMm: panel.wMm - s,
		hMm: panel.hMm - s,
		radiusMm: p.panelRadiusMm,
		stroke: hex(p.frameHex),
		strokeMm: s
	});
}

/** A runner's colour for screen and press. */
export function runnerColour(r: Pick<RogueRunner, 'colourHex' | 'cmyk'>): Colour {
	return { hex: r.colourHex, cmyk: cmykFractions(r.cmyk) };
}
