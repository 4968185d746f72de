/**
 * Imposition: where the cards of one size go on a sheet. Pure arithmetic in mm, measured from
 * the sheet's top-left corner with y downwards (the same frame as the display list).
 *
 * The grid is always centred on the sheet. Centring is what makes duplex work: a centred grid
 * mirrored about the sheet's centre line lands on itself, so each back falls behind its front
 * whatever the printer does at the sheet's edges.
 *
 * Layouts:
 * - spaced: every card keeps its full bleed; a gutter separates neighbouring bleed boxes.
 * - butted: neighbours share a cut line; the inner bleed is clipped away and only the
 *   bleed around the outside of the whole grid is kept (fewer cuts, more cards per sheet).
 * - fold: fold-and-glue; each card's front with its back to the right, the two trims meeting
 *   at a fold line (so the back is the front's mirror image about that line, as on a duplex
 *   page turned about a vertical edge). Pairs are spaced like cards in the spaced layout.
 */

export type ImposeLayout = 'spaced' | 'butted' | 'fold';
export type Orientation = 'portrait' | 'landscape';

export interface BoxMm {
	xMm: number;
	yMm: number;
	widthMm: number;
	heightMm: number;
}

export interface ImposeInput {
	/** The sheet, either way round; orientation decides which side is the width. */
	sheet: { widthMm: number; heightMm: number };
	/** The printer's unprintable border on every side. */
	marginMm: number;
	trimWidthMm: number;
	trimHeightMm: number;
	bleedMm: number;
	layout: ImposeLayout;
	orientation?: Orientation | 'auto';
	/** Space between bleed boxes in the spaced and fold layouts. */
	gutterMm?: number;
	/** Room kept free outside the grid's outer bleed on every side (for crop marks). */
	markSpaceMm?: number;
}

export interface Slot {
	index: number;
	column: number;
	row: number;
	/** 'back' only in the fold layout, where each card's back sits beside its front. */
	side: 'front' | 'back';
	trimBox: BoxMm;
	/** Trim plus bleed on every side: the face box the display list is drawn into. */
	bleedBox: BoxMm;
	/** What is kept of the bleed box: all of it (spaced), or the outer bleed only (butted, fold). */
	clipBox: BoxMm;
}

export interface Imposition {
	ok: true;
	layout: ImposeLayout;
	orientation: Orientation;
	sheetWidthMm: number;
	sheetHeightMm: number;
	marginMm: number;
	trimWidthMm: number;
	trimHeightMm: number;
	bleedMm: number;
	gutterMm: number;
	/** Cells across and down (in the fold layout a cell is a front-and-back pair). */
	columns: number;
	rows: number;
	/** Cards per sheet. */
	cardsPerSheet: number;
	/** Everything that is inked, outer bleed included. */
	gridBox: BoxMm;
	/** Fronts first in reading order (left to right, top to bottom); fold backs follow their fronts. */
	slots: Slot[];
	/** Distinct cut positions across the sheet (x, vertical cuts) and down it (y, horizontal cuts). */
	cutsXMm: number[];
	cutsYMm: number[];
	/** Fold lines (fold layout only), vertical, at these x positions. */
	foldsXMm: number[];
}

export interface ImposeError {
	ok: false;
	error: string;
}

/** The default gutter between bleed boxes (spaced and fold). Room for a blade; common practice. */
export const DEFAULT_GUTTER_MM = 2;

export function impose(input: ImposeInput): Imposition | ImposeError {
	const { trimWidthMm: w, trimHeightMm: h, bleedMm: b, marginMm } = input;
	if (!(w > 0 && h > 0)) return { ok: false, error: 'card size must be positive' };
	if (b < 0 || marginMm < 0) return { ok: false, error: 'bleed and margin cannot be negative' };
	const choice = input.orientation ?? 'auto';
	const candidates: Orientation[] = choice === 'auto' ? ['portrait', 'landscape'] : [choice];
	let best: Imposition | undefined;
	const errors: string[] = [];
	for (const orientation of candidates) {
		const r = imposeOne(input, orientation);
		if (!r.ok) errors.push(r.error);
		// Ties keep portrait, the way the sheet is usually fed.
		else if (!best || r.cardsPerSheet > best.cardsPerSheet) best = r;
	}
	return best ?? { ok: false, error: errors[0] };
}

function imposeOne(input: ImposeInput, orientation: Orientation): Imposition | ImposeError {
	const { trimWidthMm: w, trimHeightMm: h, bleedMm: b, marginMm, layout } = input;
	const short = Math.min(input.sheet.widthMm, input.sheet.heightMm);
	const long = Math.max(input.sheet.widthMm, input.sheet.heightMm);
	const sheetW = orientation === 'portrait' ? short : long;
	const sheetH = orientation === 'portrait' ? long : short;
	const gutter = layout === 'butted' ? 0 : (input.gutterMm ?? DEFAULT_GUTTER_MM);
	const reserve = marginMm + (input.markSpaceMm ?? 0);
	const roomW = sheetW - 2 * reserve;
	const roomH = sheetH - 2 * reserve;

	// Size of one cell's ink and the pitch between cells, per layout.
	const cellW = layout === 'fold' ? 2 * w + 2 * b : w + 2 * b;
	const cellH = h + 2 * b;
	const what = layout === 'fold' ? 'a card with its back beside it' : 'the card';
	const fmt = (v: number) => Math.round(v * 100) / 100;
	if (cellW > roomW + 1e-9 || cellH > roomH + 1e-9) {
		return {
			ok: false,
			error:
				`${what} with bleed (${fmt(cellW)} × ${fmt(cellH)} mm) is larger than the printable area of a ` +
				`${orientation} sheet (${fmt(roomW)} × ${fmt(roomH)} mm)`
		};
	}
	let columns: number;
	let rows: number;
	let gridW: number;
	let gridH: number;
	if (layout === 'butted') {
		// n cards share n + 1 cut lines; only the outer bleed is added: n·w + 2b ≤ room.
		columns = Math.floor((roomW - 2 * b + 1e-9) / w);
		rows = Math.floor((roomH - 2 * b + 1e-9) / h);
		gridW = columns * w + 2 * b;
		gridH = rows * h + 2 * b;
	} else {
		// n cells with n − 1 gutters: n·cell + (n − 1)·gutter ≤ room.
		columns = Math.floor((roomW + gutter + 1e-9) / (cellW + gutter));
		rows = Math.floor((roomH + gutter + 1e-9) / (cellH + gutter));
		gridW = columns * cellW + (columns - 1) * gutter;
		gridH = rows * cellH + (rows - 1) * gutter;
	}
	const x0 = (sheetW - gridW) / 2;
	const y0 = (sheetH - gridH) / 2;

	const slots: Slot[] = [];
	const cutsX = new Set<number>();
	const cutsY = new Set<number>();
	const folds: number[] = [];
	const box = (xMm: number, yMm: number, widthMm: number, heightMm: number): BoxMm => ({ xMm, yMm, widthMm, heightMm });
	const grow = (t: BoxMm, by: number) => box(t.xMm - by, t.yMm - by, t.widthMm + 2 * by, t.heightMm + 2 * by);
	const fronts: Slot[] = [];
	const backs: Slot[] = [];
	for (let row = 0; row < rows; row++) {
		for (let column = 0; column < columns; column++) {
			if (layout === 'butted') {
				const trim = box(x0 + b + column * w, y0 + b + row * h, w, h);
				// Keep the bleed only on edges that face the outside of the grid.
				const left = column === 0 ? b : 0;
				const right = column === columns - 1 ? b : 0;
				const top = row === 0 ? b : 0;
				const bottom = row === rows - 1 ? b : 0;
				const clip = box(trim.xMm - left, trim.yMm - top, w + left + right, h + top + bottom);
				fronts.push({ index: 0, column, row, side: 'front', trimBox: trim, bleedBox: grow(trim, b), clipBox: clip });
				cutsX.add(trim.xMm).add(trim.xMm + w);
				cutsY.add(trim.yMm).add(trim.yMm + h);
			} else {
				const cellX = x0 + column * (cellW + gutter);
				const cellY = y0 + row * (cellH + gutter);
				const trim = box(cellX + b, cellY + b, w, h);
				if (layout === 'spaced') {
					const bleed = grow(trim, b);
					fronts.push({ index: 0, column, row, side: 'front', trimBox: trim, bleedBox: bleed, clipBox: bleed });
					cutsX.add(trim.xMm).add(trim.xMm + w);
				} else {
					// Front on the left, back on the right; the shared trim edge is the fold.
					const foldX = trim.xMm + w;
					const back = box(foldX, trim.yMm, w, h);
					fronts.push({
						index: 0, column, row, side: 'front', trimBox: trim, bleedBox: grow(trim, b),
						clipBox: box(trim.xMm - b, trim.yMm - b, w + b, h + 2 * b)
					});
					backs.push({
						index: 0, column, row, side: 'back', trimBox: back, bleedBox: grow(back, b),
						clipBox: box(foldX, back.yMm - b, w + b, h + 2 * b)
					});
					if (row === 0) folds.push(foldX);
					cutsX.add(trim.xMm).add(foldX + w);
				}
				cutsY.add(trim.yMm).add(trim.yMm + h);
			}
		}
	}
	// Fronts in reading order; in the fold layout each back comes right after its front.
	fronts.forEach((f, i) => {
		slots.push({ ...f, index: slots.length });
		if (backs[i]) slots.push({ ...backs[i], index: slots.length });
	});
	const sorted = (s: Set<number>) => [...s].map((v) => +v.toFixed(6)).sort((a, b2) => a - b2).filter((v, i, a) => i === 0 || v - a[i - 1] > 1e-6);
	return {
		ok: true,
		layout,
		orientation,
		sheetWidthMm: sheetW,
		sheetHeightMm: sheetH,
		marginMm,
		trimWidthMm: w,
		trimHeightMm: h,
		bleedMm: b,
		gutterMm: gutter,
		columns,
		rows,
		cardsPerSheet: columns * rows,
		gridBox: box(x0, y0, gridW, gridH),
		slots,
		cutsXMm: sorted(cutsX),
		cutsYMm: sorted(cutsY),
		foldsXMm: folds
	};
}

/** The printable area: the sheet less the printer margin on every side. */
export function printableBox(imp: Pick<Imposition, 'sheetWidthMm' | 'sheetHeightMm' | 'marginMm'>): BoxMm {
	return {
		xMm: imp.marginMm,
		yMm: imp.marginMm,
		widthMm: imp.sheetWidthMm - 2 * imp.marginMm,
		heightMm: imp.sheetHeightMm - 2 * imp.marginMm
	};
}
