/**
 * Setup card front: one card per player count, printing its deal table (hand size, cards put
 * aside, cards to the shared deck, cards face up, extra cards from the deck, rogue cards added to
 * the shared deck) and the track length. A row whose field the card leaves out is not printed.
 */
import type { SetupData } from '../../game/model';
import { MM_PER_PT } from '../text';
import type { FaceContext } from './context';
import { hex, type Box } from './face-builder';
import { drawBand, drawFrame, drawGround, type FrontParams } from './frame';
import type { FracBox } from './templates';

export interface SetupParams extends FrontParams {
	accentHex: string;
	tintHex: string;
	subtitlePt: number;
	bodyPt: number;
	bodyMinPt: number;
	valuePt: number;
	titleFormat: string;
	subtitle: string;
	rows: { field: string; label: string }[];
	tableBox: FracBox;
}

/** The deal-table fields a setup card can print, in the data's own names. */
export const SETUP_FIELDS = ['handSize', 'discards', 'toSharedDeck', 'faceUp', 'extraFromDeck', 'rogueToDeck', 'trackLength'] as const;
type SetupField = (typeof SETUP_FIELDS)[number];
const isSetupField = (f: string): f is SetupField => (SETUP_FIELDS as readonly string[]).includes(f);

export function drawSetup(ctx: FaceContext<SetupParams>, data: SetupData) {
	const { b, params: p } = ctx;
	drawGround(b, p.backgroundHex);
	const { panel } = drawBand(b, p, {
		colour: hex(p.accentHex),
		title: p.titleFormat.replace('{players}', String(data.players)),
		titleLabel: 'setup title'
	});
	drawFrame(b, p, panel);

	let box: Box = b.place(p.tableBox);
	if (p.show.subtitle && p.subtitle) {
		const r = b.text(p.subtitle, { ...box, hMm: 5 }, {
			maxPt: p.subtitlePt,
			minPt: 5,
			weight: 'bold',
			align: 'center',
			valign: 'top',
			wrap: false,
			ellipsis: true,
			fill: hex(p.mutedHex),
			label: 'subtitle'
		});
		box = { ...box, yMm: box.yMm + r.heightMm + 1, hMm: box.hMm - r.heightMm - 1 };
	}
	const rows = p.rows.filter((r) => {
		if (!isSetupField(r.field)) {
			b.warn(`setup layout row “${r.field}” is not a setup field`);
			return false;
		}
		return p.show[r.field] !== false && data[r.field] !== undefined;
	});
	if (rows.length === 0) return;
	const rowMm = Math.min(12, box.hMm / rows.length);
	// One size for every label and every value, so the table reads as a table.
	const labelPt = Math.max(p.bodyMinPt, Math.min(p.bodyPt, (rowMm * 0.42) / (1.32 * MM_PER_PT)));
	const valuePt = Math.max(p.bodyMinPt, Math.min(p.valuePt, (rowMm * 0.8) / (1.32 * MM_PER_PT)));
	const padMm = 2;
	const valueW = Math.min(14, box.wMm * 0.26);
	rows.forEach((row, i) => {
		const y = box.yMm + i * rowMm;
		if (i % 2 === 0) b.add({ type: 'rect', xMm: box.xMm, yMm: y, wMm: box.wMm, hMm: rowMm, radiusMm: 1.2, fill: hex(p.tintHex) }, 'deal table row');
		b.text(row.label, { xMm: box.xMm + padMm, yMm: y + 0.6, wMm: box.wMm - valueW - 2 * padMm, hMm: rowMm - 1.2 }, {
			maxPt: labelPt,
			minPt: p.bodyMinPt,
			align: 'left',
			valign: 'middle',
			maxLines: 2,
			lineHeight: 1.1,
			fill: hex(p.inkHex),
			label: `deal table label ${row.field}`
		});
		b.text(String(data[row.field as SetupField]), { xMm: box.xMm + box.wMm - valueW - padMm, yMm: y, wMm: valueW, hMm: rowMm }, {
			maxPt: valuePt,
			minPt: p.bodyMinPt,
			weight: 'bold',
			align: 'right',
			valign: 'middle',
			wrap: false,
			fill: hex(p.inkHex),
			label: `deal table value ${row.field}`
		});
	});
}
