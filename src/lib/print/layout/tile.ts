/**
 * Track tiles, both sides: the tile's number in a badge, its spaces drawn as cells along the
 * long side, a start line or finish chequers by role. Tiles are double-sided, so the back is
 * per card: the reverse side with its own space count and label.
 */
import type { TileData } from '../../game/model';
import { slotArt, type FaceContext } from './context';
import { drawArtSlot } from './art';
import { hex, type Box, type FaceBuilder } from './face-builder';
import { drawGround } from './frame';
import { fitText } from '../text';
import type { FracBox } from './templates';

export interface TileParams extends Record<string, unknown> {
	backgroundHex: string;
	inkHex: string;
	mutedHex: string;
	lightInkHex: string;
	cellHex: string;
	cellStrokeHex: string;
	cellStrokeMm: number;
	cellRadiusMm: number;
	cellGapMm: number;
	minCellMm: number;
	cornerRadiusMm: number;
	numberPt: number;
	labelPt: number;
	labelMinPt: number;
	roleLabels?: Record<string, string>;
	show: Record<string, boolean>;
	headerFrac: number;
	cellsBox: FracBox;
}

/**
 * The start line is one solid ink bar. It used to be a 1.6 mm bar outlined in the light cell colour,
 * which left a 0.8 mm dark core between two light hairlines: at screen sizes it read as a white
 * sliver at the tile's left edge. Solid and wider, it reads as a line.
 */
export const START_LINE_MM = 2.5;
const CHEQUER_COLUMNS = 2;

function drawHeader(b: FaceBuilder, p: TileParams, number: number, label: string) {
	const safe = b.safe;
	const h = p.headerFrac * safe.hMm;
	let left = safe.xMm;
	if (p.show.number) {
		const d = Math.min(h, 14);
		const cx = safe.xMm + d / 2;
		const cy = safe.yMm + d / 2;
		// A light ring keeps the badge clear of any ground art.
		const ring = 0.5;
		b.add(
			{ type: 'ellipse', cxMm: cx, cyMm: cy, rxMm: d / 2 - ring / 2, ryMm: d / 2 - ring / 2, fill: hex(p.inkHex), stroke: hex(p.cellHex), strokeMm: ring },
			'tile number badge'
		);
		const w = d * 0.74;
		b.text(String(number), { xMm: cx - w / 2, yMm: cy - w / 2, wMm: w, hMm: w }, {
			maxPt: p.numberPt,
			minPt: 5,
			weight: 'bold',
			align: 'center',
			valign: 'middle',
			wrap: false,
			fill: hex(p.lightInkHex),
			label: 'tile number'
		});
		left += d + 2.5;
	}
	if (!label) return;
	// The label sits on a light pill, so it reads on the plain ground and on ground art alike.
	const padX = 2;
	const padY = 1;
	const slot: Box = { xMm: left, yMm: safe.yMm, wMm: safe.xMm + safe.wMm - left, hMm: Math.min(h, 14) };
	const inner: Box = { xMm: slot.xMm + padX, yMm: slot.yMm + padY, wMm: slot.wMm - 2 * padX, hMm: slot.hMm - 2 * padY };
	const opts = {
		maxPt: p.labelPt,
		minPt: p.labelMinPt,
		weight: 'bold' as const,
		align: 'right' as const,
		valign: 'middle' as const,
		maxLines: 2,
		lineHeight: 1.1,
		fill: hex(p.inkHex),
		label: 'tile label'
	};
	const m = fitText(b.fonts, label, inner, opts);
	const pillH = Math.min(slot.hMm, m.heightMm + 2 * padY);
	b.add(
		{
			type: 'rect',
			xMm: inner.xMm + inner.wMm - m.widthMm - padX,
			yMm: slot.yMm + (slot.hMm - pillH) / 2,
			wMm: Math.min(slot.wMm, m.widthMm + 2 * padX),
			hMm: pillH,
			radiusMm: Math.min(pillH / 2, 3),
			fill: hex(p.cellHex)
		},
		'tile label'
	);
	b.text(label, inner, opts);
}

/** Finish chequers: a two-column band of alternating squares filling `box`'s height. */
function drawChequers(b: FaceBuilder, p: TileParams, box: Box) {
	const sq = box.wMm / CHEQUER_COLUMNS;
	const rows = Math.max(1, Math.floor(box.hMm / sq));
	const sqH = box.hMm / rows;
	const s = 0.3;
	b.add(
		{ type: 'rect', xMm: box.xMm + s / 2, yMm: box.yMm + s / 2, wMm: box.wMm - s, hMm: box.hMm - s, fill: hex(p.cellHex), stroke: hex(p.inkHex), strokeMm: s },
		'finish chequers'
	);
	for (let r = 0; r < rows; r++)
		for (let c = 0; c < CHEQUER_COLUMNS; c++)
			if ((r + c) % 2 === 0)
				b.add({ type: 'rect', xMm: box.xMm + c * sq, yMm: box.yMm + r * sqH, wMm: sq, hMm: sqH, fill: hex(p.inkHex) }, 'finish chequers');
}

function drawCells(b: FaceBuilder, p: TileParams, area: Box, spaces: number, role: TileData['role']) {
	let box = { ...area };
	const horizontal = box.wMm >= box.hMm;
	// Role markers sit at the ends of the row of cells: a bar before the first, chequers after the last.
	if (role === 'start') {
		const bar: Box = horizontal
			? { xMm: box.xMm, yMm: box.yMm, wMm: START_LINE_MM, hMm: box.hMm }
			: { xMm: box.xMm, yMm: box.yMm + box.hMm - START_LINE_MM, wMm: box.wMm, hMm: START_LINE_MM };
		b.add({ type: 'rect', ...bar, radiusMm: Math.min(p.cellRadiusMm, START_LINE_MM / 2), fill: hex(p.inkHex) }, 'start line');
		box = horizontal
			? { ...box, xMm: box.xMm + START_LINE_MM + p.cellGapMm, wMm: box.wMm - START_LINE_MM - p.cellGapMm }
			: { ...box, hMm: box.hMm - START_LINE_MM - p.cellGapMm };
	}
	if (role === 'finish') {
		const depth = Math.min(6, (horizontal ? box.wMm : box.hMm) * 0.12);
		const strip: Box = horizontal
			? { xMm: box.xMm + box.wMm - depth, yMm: box.yMm, wMm: depth, hMm: box.hMm }
			: { xMm: box.xMm, yMm: box.yMm, wMm: box.wMm, hMm: depth };
		drawChequers(b, p, horizontal ? strip : { ...strip });
		box = horizontal
			? { ...box, wMm: box.wMm - depth - p.cellGapMm }
			: { ...box, yMm: box.yMm + depth + p.cellGapMm, hMm: box.hMm - depth - p.cellGapMm };
	}
	if (spaces <= 0) return;
	const along = horizontal ? box.wMm : box.hMm;
	const cellMm = (along - (spaces - 1) * p.cellGapMm) / spaces;
	if (cellMm < p.minCellMm)
		b.warn(`${spaces} spaces make cells ${cellMm.toFixed(1)} mm deep, under the ${p.minCellMm} mm the layout allows`);
	for (let i = 0; i < spaces; i++) {
		// Spaces run left to right, or bottom to top on an upright tile.
		const cell: Box = horizontal
			? { xMm: box.xMm + i * (cellMm + p.cellGapMm), yMm: box.yMm, wMm: cellMm, hMm: box.hMm }
			: { xMm: box.xMm, yMm: box.yMm + box.hMm - (i + 1) * cellMm - i * p.cellGapMm, wMm: box.wMm, hMm: cellMm };
		const s = p.cellStrokeMm;
		b.add(
			{
				type: 'rect',
				xMm: cell.xMm + s / 2,
				yMm: cell.yMm + s / 2,
				wMm: Math.max(0, cell.wMm - s),
				hMm: Math.max(0, cell.hMm - s),
				radiusMm: p.cellRadiusMm,
				fill: hex(p.cellHex),
				stroke: hex(p.cellStrokeHex),
				strokeMm: s
			},
			`space ${i + 1}`
		);
		if (p.show.cellNumbers)
			b.text(String(i + 1), { xMm: cell.xMm + 0.8, yMm: cell.yMm + 0.8, wMm: cell.wMm - 1.6, hMm: Math.min(4, cell.hMm / 3) }, {
				maxPt: 7,
				minPt: 4,
				align: 'left',
				valign: 'top',
				wrap: false,
				fill: hex(p.mutedHex),
				label: `number of space ${i + 1}`
			});
	}
}

/** The tile's ground: its colour, and the kind's ground art to the bleed edge when shown. */
function drawTileGround(ctx: FaceContext<TileParams>) {
	const { b, params: p } = ctx;
	drawGround(b, p.backgroundHex);
	const art = p.show.art ? slotArt(ctx) : undefined;
	// Without art the plain colour is the design, so no placeholder is drawn.
	if (art?.image) drawArtSlot(b, b.face, art.slot, art.art, art.image, { radiusMm: 0, tintHex: p.backgroundHex, lineHex: p.mutedHex, inkHex: p.inkHex }, false);
	else if (art?.art) b.warn(`art “${art.art.fileName}” for slot ${art.slot} is not loaded`);
}

export function drawTileFront(ctx: FaceContext<TileParams>, data: TileData) {
	const { b, params: p } = ctx;
	drawTileGround(ctx);
	drawHeader(b, p, data.number, p.show.role ? (p.roleLabels?.[data.role] ?? '') : '');
	drawCells(b, p, b.place(p.cellsBox), data.spacesFront, data.role);
}

export function drawTileBack(ctx: FaceContext<TileParams>, data: TileData) {
	const { b, params: p } = ctx;
	drawTileGround(ctx);
	drawHeader(b, p, data.number, p.show.label ? data.backLabel : '');
	drawCells(b, p, b.place(p.cellsBox), data.spacesBack, data.role);
}
