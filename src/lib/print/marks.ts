/**
 * Printer's marks for an imposed sheet: crop marks at every cut line, fold marks for the
 * fold-and-glue layout, and a one-line sheet label. Geometry is pure (mm, top-left origin);
 * `drawSheetMarks` puts it on a pdf-lib page.
 *
 * Everything stays outside the cards' bleed and inside the printable area: nothing is inked
 * in the printer margin, where a home printer would drop it anyway.
 */
import { cmyk, LineCapStyle, type Color, type PDFFont, type PDFPage } from 'pdf-lib';
import type { Imposition } from './impose';
import { PT_PER_MM } from './paper';

export const CROP_MARK = {
	/** About 6 mm long where the margin allows (common practice). */
	lengthMm: 6,
	/** Gap between the bleed edge and the mark's start, so the offset from the trim is bleed + gap ≥ bleed. */
	gapMm: 0.5,
	/** Shorter than this a mark is hard to find; it is left out. */
	minLengthMm: 1,
	/** A hairline, 0.25 pt (common practice for crop marks). */
	hairlinePt: 0.25
};

/** Registration colour: full coverage of all four process inks, so marks print on every plate. */
export const REGISTRATION = cmyk(1, 1, 1, 1);

export interface MarkLine {
	kind: 'crop' | 'fold';
	x1Mm: number;
	y1Mm: number;
	x2Mm: number;
	y2Mm: number;
}

export interface SheetLabel {
	text: string;
	xMm: number;
	/** Baseline, mm from the sheet's top. */
	baselineMm: number;
	sizePt: number;
}

export interface SheetMarks {
	lines: MarkLine[];
	label?: SheetLabel;
	warnings: string[];
}

export interface SheetMarksOptions {
	cropMarks: boolean;
	label?: {
		/** What to print, best first: a shorter text is used when a longer one has no room. */
		texts: string[];
		/** Width of a text at a font size, in mm (measured with the font that will draw it). */
		widthMm: (text: string, sizePt: number) => number;
	};
}

/** Label sizes to try, largest first. */
const LABEL_SIZES_PT = [6, 5, 4.5];
/** Roboto Slab glyph extents (its own metrics, 2048 units/em): accented capitals reach 1911 up, descenders 463 down. */
const ASCENT_EM = 0.95;
const DESCENT_EM = 0.23;
const CLEARANCE_MM = 0.5;

interface Band {
	side: 'top' | 'bottom';
	/** From the grid's bleed edge plus the mark gap to the printable edge. */
	startMm: number;
	endMm: number;
}

export function sheetMarks(imp: Imposition, opts: SheetMarksOptions): SheetMarks {
	const m = imp.marginMm;
	const W = imp.sheetWidthMm;
	const H = imp.sheetHeightMm;
	const g = imp.gridBox;
	const gap = CROP_MARK.gapMm;
	const warnings: string[] = [];

	// Room for marks on each side: from the grid's outer bleed (+ gap) to the printer margin.
	const room = {
		top: g.yMm - gap - m,
		bottom: H - m - (g.yMm + g.heightMm + gap),
		left: g.xMm - gap - m,
		right: W - m - (g.xMm + g.widthMm + gap)
	};
	const limit = { ...room };

	let label: SheetLabel | undefined;
	if (opts.label) {
		label = placeLabel(imp, opts.label, room, limit, opts.cropMarks);
		if (!label) warnings.push('no room for the sheet label outside the cards');
	}

	const lines: MarkLine[] = [];
	const lengthFor = (side: keyof typeof room) => Math.min(CROP_MARK.lengthMm, limit[side]);
	const along = (kind: MarkLine['kind'], xs: number[]) => {
		const top = lengthFor('top');
		const bottom = lengthFor('bottom');
		for (const x of xs) {
			if (top >= CROP_MARK.minLengthMm) lines.push({ kind, x1Mm: x, y1Mm: g.yMm - gap, x2Mm: x, y2Mm: g.yMm - gap - top });
			const y = g.yMm + g.heightMm + gap;
			if (bottom >= CROP_MARK.minLengthMm) lines.push({ kind, x1Mm: x, y1Mm: y, x2Mm: x, y2Mm: y + bottom });
		}
	};
	if (opts.cropMarks) {
		along('crop', imp.cutsXMm);
		const left = lengthFor('left');
		const right = lengthFor('right');
		for (const y of imp.cutsYMm) {
			if (left >= CROP_MARK.minLengthMm) lines.push({ kind: 'crop', x1Mm: g.xMm - gap, y1Mm: y, x2Mm: g.xMm - gap - left, y2Mm: y });
			const x = g.xMm + g.widthMm + gap;
			if (right >= CROP_MARK.minLengthMm) lines.push({ kind: 'crop', x1Mm: x, y1Mm: y, x2Mm: x + right, y2Mm: y });
		}
		if (Math.max(lengthFor('top'), lengthFor('bottom')) < CROP_MARK.minLengthMm)
			warnings.push('no room for crop marks above or below the cards');
		if (Math.max(lengthFor('left'), lengthFor('right')) < CROP_MARK.minLengthMm)
			warnings.push('no room for crop marks beside the cards');
	}
	if (imp.layout === 'fold') along('fold', imp.foldsXMm);
	return { lines, label, warnings };
}

/**
 * Finds a place for the label in the band below (else above) the grid: beyond the ends of the
 * crop marks if the band is deep enough (shortening the marks there if need be), or between
 * two marks where the band is shallow.
 */
function placeLabel(
	imp: Imposition,
	text: NonNullable<SheetMarksOptions['label']>,
	room: Record<'top' | 'bottom' | 'left' | 'right', number>,
	limit: Record<'top' | 'bottom' | 'left' | 'right', number>,
	cropMarks: boolean
): SheetLabel | undefined {
	const m = imp.marginMm;
	const W = imp.sheetWidthMm;
	const H = imp.sheetHeightMm;
	const g = imp.gridBox;
	const gap = CROP_MARK.gapMm;
	const bands: Band[] = [
		{ side: 'bottom', startMm: g.yMm + g.heightMm + gap, endMm: H - m },
		{ side: 'top', startMm: g.yMm - gap, endMm: m }
	];
	const marksX = [...(cropMarks ? imp.cutsXMm : []), ...(imp.layout === 'fold' ? imp.foldsXMm : [])].sort((a, b) => a - b);
	const hasMarks = marksX.length > 0;

	for (const candidate of text.texts) {
		for (const sizePt of LABEL_SIZES_PT) {
			const emMm = sizePt / PT_PER_MM;
			const heightMm = (ASCENT_EM + DESCENT_EM) * emMm;
			const widthMm = text.widthMm(candidate, sizePt);
			if (widthMm > W - 2 * m) continue;
			const at = (band: Band, xMm: number): SheetLabel => ({
				text: candidate,
				xMm,
				// Sit on the printable edge of the band (the edge farthest from the cards).
				baselineMm: band.side === 'bottom' ? band.endMm - DESCENT_EM * emMm : band.endMm + ASCENT_EM * emMm,
				sizePt
			});
			const centred = Math.min(Math.max((W - widthMm) / 2, m), W - m - widthMm);
			// 1. Beyond full-length marks.
			for (const band of bands) {
				const depth = room[band.side];
				if (depth >= heightMm + (hasMarks ? CROP_MARK.lengthMm + CLEARANCE_MM : 0)) return at(band, centred);
			}
			// 2. Between two marks, marks kept whole.
			for (const band of bands) {
				if (room[band.side] < heightMm) continue;
				const stops = [m, ...marksX, W - m];
				// The widest gap between marks; of equal ones, the one nearest the middle of the sheet.
				let best = { from: 0, to: 0 };
				const offCentre = (a: number, b: number) => Math.abs((a + b) / 2 - W / 2);
				for (let i = 1; i < stops.length; i++) {
					const [from, to] = [stops[i - 1], stops[i]];
					const wider = to - from - (best.to - best.from);
					if (wider > 1e-6 || (wider > -1e-6 && offCentre(from, to) < offCentre(best.from, best.to))) best = { from, to };
				}
				if (best.to - best.from >= widthMm + 2 * CLEARANCE_MM) return at(band, (best.from + best.to - widthMm) / 2);
			}
			// 3. Beyond shortened marks.
			for (const band of bands) {
				const depth = room[band.side];
				if (depth >= heightMm + CLEARANCE_MM + CROP_MARK.minLengthMm) {
					limit[band.side] = depth - heightMm - CLEARANCE_MM;
					return at(band, centred);
				}
			}
		}
	}
	return undefined;
}

export interface DrawMarksOptions {
	font: PDFFont;
	/** Colour of the label text (marks are always in registration colour). */
	labelColour: Color;
}

/** Draws marks and label on a page whose sheet is `sheetHeightMm` tall. */
export function drawSheetMarks(page: PDFPage, marks: SheetMarks, sheetHeightMm: number, opts: DrawMarksOptions): void {
	const k = PT_PER_MM;
	const Y = (mm: number) => (sheetHeightMm - mm) * k;
	for (const line of marks.lines) {
		page.drawLine({
			start: { x: line.x1Mm * k, y: Y(line.y1Mm) },
			end: { x: line.x2Mm * k, y: Y(line.y2Mm) },
			thickness: CROP_MARK.hairlinePt,
			color: REGISTRATION,
			lineCap: LineCapStyle.Butt,
			...(line.kind === 'fold' ? { dashArray: [1.5 * k, 1 * k] } : {})
		});
	}
	if (marks.label) {
		const l = marks.label;
		page.drawText(l.text, { x: l.xMm * k, y: Y(l.baselineMm), size: l.sizePt, font: opts.font, color: opts.labelColour });
	}
}
