/**
 * Duplex: where each card's back goes on the back page so that, once the printer has turned
 * the sheet over, it lands exactly behind its front. Pure arithmetic in mm (top-left origin).
 *
 * A duplex printer turns the sheet about one of its edges:
 * - 'long': about a long edge. On a portrait page the long edges are the left and right
 *   sides, so the back page is the front mirrored left–right: the columns swap (first column's
 *   backs go in the last column). On a landscape page the long edges are top and bottom, so
 *   the rows swap instead.
 * - 'short': about a short edge: rows swap on a portrait page, columns on a landscape one.
 * The mirror is taken about the sheet's centre line; because the grid is centred, each back
 * lands on a slot of the same grid.
 *
 * Back offset: printers put the back side slightly off (office printers often by 1–2 mm).
 * The printer profile stores that error as it is read on the calibration sheet: looking at the
 * FRONT of the sheet against a light, how far the back's print lies to the right (+x) and
 * below (+y) where it should be. We cancel it by moving the back page's content by the opposite
 * amount as seen from the front. Seen from the front, the back page is mirrored, so:
 * - turned about a vertical axis (x mirrored): back-page shift = (+x, −y);
 * - turned about a horizontal axis (y mirrored): back-page shift = (−x, +y).
 * The offset belongs to one printer and one page orientation: calibrate with a sheet of the
 * orientation you print.
 */
import type { BoxMm, Imposition, Slot } from './impose';

export type DuplexMode = 'none' | 'long' | 'short';
/** The axis the page turns about, in the page's own terms. */
export type FlipAxis = 'vertical' | 'horizontal';

export interface BackOffsetMm {
	xMm: number;
	yMm: number;
}

export function flipAxis(mode: 'long' | 'short', sheetWidthMm: number, sheetHeightMm: number): FlipAxis {
	// A square sheet counts as portrait.
	const portrait = sheetHeightMm >= sheetWidthMm;
	if (mode === 'long') return portrait ? 'vertical' : 'horizontal';
	return portrait ? 'horizontal' : 'vertical';
}

/** How far to move the back page's content (back-page coordinates, y down) to cancel the printer's offset. */
export function backShiftMm(offset: BackOffsetMm | undefined, axis: FlipAxis): { dxMm: number; dyMm: number } {
	const x = offset?.xMm ?? 0;
	const y = offset?.yMm ?? 0;
	// +0 turns a −0 into 0, so tests and JSON read cleanly.
	return axis === 'vertical' ? { dxMm: x + 0, dyMm: -y + 0 } : { dxMm: -x + 0, dyMm: y + 0 };
}

/** A box's mirror image about the sheet's centre line. */
export function mirrorBox(box: BoxMm, axis: FlipAxis, sheetWidthMm: number, sheetHeightMm: number): BoxMm {
	return axis === 'vertical'
		? { ...box, xMm: sheetWidthMm - box.xMm - box.widthMm }
		: { ...box, yMm: sheetHeightMm - box.yMm - box.heightMm };
}

const shift = (box: BoxMm, dx: number, dy: number): BoxMm => ({ ...box, xMm: box.xMm + dx, yMm: box.yMm + dy });

/**
 * The back page's slots: `backs[i]` is where the back of the card in `imp.slots[i]` goes, with
 * the column or row it lands in and the printer's offset already cancelled.
 */
export function backSlots(imp: Imposition, mode: 'long' | 'short', offset?: BackOffsetMm): Slot[] {
	const axis = flipAxis(mode, imp.sheetWidthMm, imp.sheetHeightMm);
	const { dxMm, dyMm } = backShiftMm(offset, axis);
	const place = (b: BoxMm) => shift(mirrorBox(b, axis, imp.sheetWidthMm, imp.sheetHeightMm), dxMm, dyMm);
	return imp.slots.map((s) => ({
		...s,
		column: axis === 'vertical' ? imp.columns - 1 - s.column : s.column,
		row: axis === 'horizontal' ? imp.rows - 1 - s.row : s.row,
		trimBox: place(s.trimBox),
		bleedBox: place(s.bleedBox),
		clipBox: place(s.clipBox)
	}));
}
