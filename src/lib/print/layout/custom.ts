/**
 * Custom card front (player aids, rules summaries …): a title and the kind's fields as labelled
 * rows. The rows share one type size, the largest at which all of them fit.
 */
import type { CustomData } from '../../game/model';
import { measureTextMm, ptToMm, verticalMetricsMm, wrapText } from '../text';
import type { FaceContext } from './context';
import { drawSlot, slotArt } from './context';
import { legibleOn } from './contrast';
import { hex, type Box } from './face-builder';
import { drawBand, drawFrame, drawGround, type FrontParams } from './frame';
import type { FracBox } from './templates';

export interface CustomParams extends FrontParams {
	accentHex: string;
	labelPt: number;
	bodyPt: number;
	bodyMinPt: number;
	titleField: string;
	labels: Record<string, string>;
	bodyBox: FracBox;
	artBox: FracBox;
	bodyBoxWithArt: FracBox;
}

/** `turnOrder` or `turn_order` → `Turn order`: a readable default label for a field. */
export function fieldLabel(field: string): string {
	const words = field
		.replace(/_/g, ' ')
		.replace(/([a-z0-9])([A-Z])/g, '$1 $2')
		.toLowerCase()
		.trim();
	return words.charAt(0).toUpperCase() + words.slice(1);
}

const LINE_HEIGHT = 1.2;
const LABEL_GAP_MM = 0.5;
const ROW_GAP_MM = 2;

export function drawCustom(ctx: FaceContext<CustomParams>, data: CustomData) {
	const { b, kind, card, params: p } = ctx;
	const title = data.values[p.titleField]?.trim() || card?.name || kind.name;
	drawGround(b, p.backgroundHex);
	const { panel } = drawBand(b, p, { colour: hex(p.accentHex), title, titleLabel: 'title' });
	drawFrame(b, p, panel);
	const art = p.show.art ? slotArt(ctx) : undefined;
	if (art) drawSlot(ctx, b.place(p.artBox), art);
	const box: Box = b.place(art ? p.bodyBoxWithArt : p.bodyBox);

	const rows = kind.fields
		.filter((f) => f !== p.titleField && p.show[f] !== false)
		.map((f) => ({ field: f, label: p.labels[f] ?? fieldLabel(f), value: (data.values[f] ?? '').trim() }))
		.filter((r) => r.value !== '');
	if (rows.length === 0) return;

	const regular = b.fonts.regular.metrics;
	const bold = b.fonts.bold.metrics;
	const showLabels = p.show.labels !== false;
	const labelAt = (sizePt: number) => Math.min(p.labelPt, (p.labelPt * sizePt) / p.bodyPt);
	const blockMm = (font: typeof regular, sizePt: number, lines: number) => {
		const { ascentMm, descentMm } = verticalMetricsMm(font, sizePt);
		return ascentMm + descentMm + (lines - 1) * LINE_HEIGHT * ptToMm(sizePt);
	};
	/** Heights of each row's label and value at one size, or undefined if a word is too wide. */
	const measure = (sizePt: number) => {
		const out: { labelMm: number; valueMm: number }[] = [];
		for (const r of rows) {
			const { lines } = wrapText(regular, r.value, sizePt, box.wMm, false);
			const tooWide = lines.some((l) => measureTextMm(regular, l, sizePt) > box.wMm);
			if (tooWide) return undefined;
			out.push({ labelMm: showLabels ? blockMm(bold, labelAt(sizePt), 1) + LABEL_GAP_MM : 0, valueMm: blockMm(regular, sizePt, lines.length) });
		}
		return out;
	};
	const total = (m: { labelMm: number; valueMm: number }[]) =>
		m.reduce((s, r) => s + r.labelMm + r.valueMm, 0) + (m.length - 1) * ROW_GAP_MM;

	let sizePt = p.bodyPt;
	let heights = measure(sizePt);
	while ((!heights || total(heights) > box.hMm) && sizePt > p.bodyMinPt) {
		sizePt = Math.max(p.bodyMinPt, sizePt - 0.5);
		heights = measure(sizePt);
	}
	let y = box.yMm;
	const bottom = box.yMm + box.hMm;
	rows.forEach((r, i) => {
		if (y >= bottom - 1) {
			b.warn(`field ${r.field} has no room left on the card and is not printed`);
			return;
		}
		if (showLabels) {
			const lp = labelAt(sizePt);
			const res = b.text(r.label, { xMm: box.xMm, yMm: y, wMm: box.wMm, hMm: blockMm(bold, lp, 1) }, {
				maxPt: lp,
				minPt: Math.min(lp, 4),
				weight: 'bold',
				wrap: false,
				ellipsis: true,
				fill: hex(legibleOn(p.accentHex, p.backgroundHex)),
				label: `label of ${r.field}`
			});
			y += res.heightMm + LABEL_GAP_MM;
		}
		const want = heights?.[i]?.valueMm ?? bottom - y;
		const h = Math.min(want, bottom - y);
		const res = b.text(r.value, { xMm: box.xMm, yMm: y, wMm: box.wMm, hMm: h + 0.01 }, {
			maxPt: sizePt,
			minPt: p.bodyMinPt,
			lineHeight: LINE_HEIGHT,
			ellipsis: true,
			fill: hex(p.inkHex),
			label: `field ${r.field}`
		});
		y += res.heightMm + ROW_GAP_MM;
	});
}
