/**
 * The duplex calibration sheet: two pages printed as one double-sided sheet. The front has a
 * fine cross at the sheet's centre with millimetre scales along both arms; the back has a bold
 * cross at the centre too. Held against a light, front towards you, the bold lines show through
 * and cross the scales at the printer's misregistration, read directly as the back offset the
 * printer profile wants (see ./duplex.ts for how it is applied).
 *
 * The centre is the one point a turn about either edge maps onto itself, so the same sheet works
 * for long- and short-edge duplex.
 */
import { PDFDocument, type PDFFont, type PDFPage } from 'pdf-lib';
import { wrap } from './cutting-guide';
import { flipAxis } from './duplex';
import { loadFonts, type FontSet } from './fonts';
import type { Orientation } from './impose';
import { mmToPt, paperSize, PT_PER_MM, type PaperSpec } from './paper';
import { PdfFaceWriter } from './pdf';

export interface CalibrationInput {
	paper: PaperSpec;
	orientation?: Orientation;
	duplex: 'long' | 'short';
	marginMm: number;
	fonts?: FontSet;
}

/** Scale reach either side of the centre, in mm: office printers are often 1–2 mm off; 10 covers bad cases. */
export const SCALE_MM = 10;
/** Line widths: the front's scale is fine to read against; the back's cross is bold to show through paper. */
const FINE_MM = 0.15;
const BOLD_MM = 0.6;
const ARM_MM = 40;
const FRONT_ARM_MM = 15;
const SCALE_OFFSET_MM = 25;

export function calibrationSheetSize(input: Pick<CalibrationInput, 'paper' | 'orientation'>) {
	const p = paperSize(input.paper);
	const landscape = input.orientation === 'landscape';
	return { widthMm: landscape ? p.heightMm : p.widthMm, heightMm: landscape ? p.widthMm : p.heightMm, label: p.label };
}

export async function buildCalibrationPdf(input: CalibrationInput): Promise<Uint8Array> {
	const { widthMm: W, heightMm: H, label } = calibrationSheetSize(input);
	const doc = await PDFDocument.create();
	doc.setTitle('Duplex calibration sheet');
	doc.setProducer('Paddock');
	doc.setCreator('Paddock');
	const writer = await PdfFaceWriter.create(doc, { fonts: input.fonts ?? (await loadFonts()), colour: 'rgb' });
	const ink = writer.paint({ hex: '#000000' });
	const regular = writer.font('regular');
	const bold = writer.font('bold');
	const k = PT_PER_MM;
	const cx = W / 2;
	const cy = H / 2;
	const line = (page: PDFPage, x1: number, y1: number, x2: number, y2: number, widthMm: number) =>
		page.drawLine({ start: { x: x1 * k, y: (H - y1) * k }, end: { x: x2 * k, y: (H - y2) * k }, thickness: widthMm * k, color: ink });
	const text = (page: PDFPage, s: string, xMm: number, yMm: number, sizePt: number, font: PDFFont = regular, centred = false) => {
		const w = font.widthOfTextAtSize(s, sizePt);
		page.drawText(s, { x: xMm * k - (centred ? w / 2 : 0), y: (H - yMm) * k, size: sizePt, font, color: ink });
	};

	// The scales sit 25 mm out along the arms, away from the centre where the lines cross: the x scale
	// below the centre (crossed by the back's upright line), the y scale right of it (crossed by the level one).
	// On the back, each scale goes where the turn will put it behind its twin on the front.
	const axis = flipAxis(input.duplex, W, H);
	const scales = (page: PDFPage, side: 'front' | 'back') => {
		const sx = side === 'back' && axis === 'vertical' ? -1 : 1;
		const sy = side === 'back' && axis === 'horizontal' ? -1 : 1;
		const xScaleY = cy + sy * SCALE_OFFSET_MM;
		const yScaleX = cx + sx * SCALE_OFFSET_MM;
		line(page, cx - SCALE_MM, xScaleY, cx + SCALE_MM, xScaleY, FINE_MM);
		line(page, yScaleX, cy - SCALE_MM, yScaleX, cy + SCALE_MM, FINE_MM);
		for (let i = -SCALE_MM; i <= SCALE_MM; i++) {
			const tick = i % 5 === 0 ? 4 : 2.5;
			// Ticks point towards the centre, so the mirrored back's ticks lie on the front's.
			line(page, cx + i, xScaleY - sy * tick, cx + i, xScaleY, FINE_MM);
			line(page, yScaleX - sx * tick, cy + i, yScaleX, cy + i, FINE_MM);
			if (side === 'front' && i % 5 === 0) {
				text(page, signed(i), cx + i, xScaleY + 3, 6, regular, true);
				text(page, signed(i), yScaleX + 1, cy + i + 0.8, 6);
			}
		}
		return { xScaleY, yScaleX };
	};

	// Front: fine cross and numbered scales.
	const front = doc.addPage([mmToPt(W), mmToPt(H)]);
	front.setMediaBox(0, 0, mmToPt(W), mmToPt(H));
	// The front's own cross stops short of the scales so only the back's lines cross them.
	line(front, cx - FRONT_ARM_MM, cy, cx + FRONT_ARM_MM, cy, FINE_MM);
	line(front, cx, cy - FRONT_ARM_MM, cx, cy + FRONT_ARM_MM, FINE_MM);
	const { xScaleY, yScaleX } = scales(front, 'front');
	text(front, 'x (mm, + to the right)', cx, xScaleY + 6.5, 7, bold, true);
	text(front, 'y (mm, + downwards)', yScaleX + 6, cy + 0.8, 7, bold);

	const left = input.marginMm + 10;
	let y = input.marginMm + 14;
	const para = (s: string, sizePt: number, font: PDFFont = regular) => {
		for (const l of wrap(s, font, sizePt, (W - 2 * left) * k)) {
			text(front, l, left, y, sizePt, font);
			y += (sizePt * 1.4) / k;
		}
		y += 1.5;
	};
	para('Duplex calibration', 14, bold);
	const flip = input.duplex === 'long' ? 'long edge' : 'short edge';
	const orient = input.orientation ?? 'portrait';
	para(
		`1. Print this page and the next as one double-sided sheet on ${label} paper (${orient}), turning on the ${flip}, ` +
			'at actual size (100 %, no “fit to page”) — the same settings you will print cards with.',
		9
	);
	para('2. Hold the sheet against a bright light with this side towards you. The bold cross printed on the back shows through.', 9);
	para(
		'3. Read x where the bold upright line crosses the horizontal scale (mm, + to the right), and y where the bold ' +
			'level line crosses the upright scale (mm, + downwards). Half millimetres are fine.',
		9
	);
	para('4. Type x and y as the back offset in your printer profile, then print this sheet again: both bold lines should now sit on 0.', 9);
	text(front, `front · ${label} ${orient} · ${flip}`, left, H - input.marginMm - 8, 7);

	// Back: bold cross at the centre with matching (unnumbered) ticks: when the sheet is right,
	// they lie exactly behind the front's.
	const back = doc.addPage([mmToPt(W), mmToPt(H)]);
	back.setMediaBox(0, 0, mmToPt(W), mmToPt(H));
	line(back, cx - ARM_MM, cy, cx + ARM_MM, cy, BOLD_MM);
	line(back, cx, cy - ARM_MM, cx, cy + ARM_MM, BOLD_MM);
	scales(back, 'back');
	text(back, 'Back of the duplex calibration sheet — read it from the other side, against a light.', cx, input.marginMm + 14, 9, regular, true);
	return doc.save();
}

const signed = (v: number) => (v > 0 ? `+${v}` : v === 0 ? '0' : `−${-v}`);
