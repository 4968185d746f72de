/**
 * Per-card press files: one PDF per card face, the front on page 1 and the back on page 2,
 * each page exactly the card with its bleed. The boxes tell the print shop's software what is
 * what (ISO 32000-1 §14.11.2): TrimBox is the finished card, BleedBox the trim plus bleed,
 * MediaBox the whole page; MediaBox ⊇ BleedBox ⊇ TrimBox. With crop marks, the page grows
 * beyond the bleed to make room for them, so MediaBox is then larger than BleedBox.
 */
import { PDFDocument, type PDFPage } from 'pdf-lib';
import type { FaceLayout, ImageAsset } from './display-list';
import { faceHeightMm, faceWidthMm } from './display-list';
import { loadFonts, type FontSet } from './fonts';
import { CROP_MARK, drawSheetMarks, type MarkLine } from './marks';
import { PT_PER_MM } from './paper';
import { PdfFaceWriter, type ColourMode } from './pdf';
import type { EncodedImageStore } from './pdf-image';
import { finishPdfx, pressOutput, savePdfx, type PdfxTarget } from './pdfx';

/** Mark length on a press file: shorter than on a sheet, since the page only has to carry them. */
export const PRESS_MARK_LENGTH_MM = 5;
/** Room around the bleed box when marks are wanted: gap + mark + a little paper. */
export const PRESS_MARK_ROOM_MM = CROP_MARK.gapMm + PRESS_MARK_LENGTH_MM + 0.5;

export interface PressBoxes {
	/** All in pt, origin at the page's bottom-left. */
	mediaBox: { x: number; y: number; width: number; height: number };
	bleedBox: { x: number; y: number; width: number; height: number };
	trimBox: { x: number; y: number; width: number; height: number };
}

export function pressBoxes(face: FaceLayout, cropMarks: boolean): PressBoxes {
	const k = PT_PER_MM;
	const room = cropMarks ? PRESS_MARK_ROOM_MM : 0;
	const fw = faceWidthMm(face);
	const fh = faceHeightMm(face);
	return {
		mediaBox: { x: 0, y: 0, width: (fw + 2 * room) * k, height: (fh + 2 * room) * k },
		bleedBox: { x: room * k, y: room * k, width: fw * k, height: fh * k },
		trimBox: {
			x: (room + face.bleedMm) * k,
			y: (room + face.bleedMm) * k,
			width: face.trimWidthMm * k,
			height: face.trimHeightMm * k
		}
	};
}

/** Corner crop marks for one card: two per corner, on the trim lines, starting outside the bleed. */
export function pressMarks(face: FaceLayout): MarkLine[] {
	const room = PRESS_MARK_ROOM_MM;
	const b = face.bleedMm;
	const gap = CROP_MARK.gapMm;
	const len = PRESS_MARK_LENGTH_MM;
	const left = room + b;
	const top = room + b;
	const right = left + face.trimWidthMm;
	const bottom = top + face.trimHeightMm;
	const outL = room - gap; // just outside the bleed box, going outwards
	const outT = room - gap;
	const outR = room + faceWidthMm(face) + gap;
	const outB = room + faceHeightMm(face) + gap;
	const lines: MarkLine[] = [];
	for (const x of [left, right]) {
		lines.push({ kind: 'crop', x1Mm: x, y1Mm: outT, x2Mm: x, y2Mm: outT - len });
		lines.push({ kind: 'crop', x1Mm: x, y1Mm: outB, x2Mm: x, y2Mm: outB + len });
	}
	for (const y of [top, bottom]) {
		lines.push({ kind: 'crop', x1Mm: outL, y1Mm: y, x2Mm: outL - len, y2Mm: y });
		lines.push({ kind: 'crop', x1Mm: outR, y1Mm: y, x2Mm: outR + len, y2Mm: y });
	}
	return lines;
}

export interface PressPdfInput {
	title?: string;
	front: FaceLayout;
	back?: FaceLayout;
	images?: ImageAsset[] | ReadonlyMap<string, ImageAsset>;
	colour?: ColourMode;
	cropMarks?: boolean;
	fonts?: FontSet;
	/** Encoded image pixels kept between documents (see ./pdf-image.ts). */
	imageStore?: EncodedImageStore;
	/** YYYY-MM-DD: the document's date, so the same input gives the same bytes (now when absent). */
	date?: string;
	/** A PDF/X file for a press profile instead of plain RGB or CMYK. */
	pdfx?: PdfxTarget;
	/** Told of colours and pictures over the profile's total ink limit (PDF/X only). */
	onInkOver?: (what: string, pct: number, imageId?: string) => void;
}

export async function buildPressPdf(input: PressPdfInput): Promise<Uint8Array> {
	const doc = await PDFDocument.create();
	if (input.title) doc.setTitle(input.title);
	doc.setProducer('Paddock');
	doc.setCreator('Paddock');
	const stamp = input.date ? new Date(`${input.date}T00:00:00Z`) : undefined;
	if (stamp && !Number.isNaN(stamp.getTime())) {
		doc.setCreationDate(stamp);
		doc.setModificationDate(stamp);
	}
	const pdfx = input.pdfx;
	const seed = `${input.title ?? ''}|${input.date ?? ''}|${pdfx?.standard}|${pdfx?.intent}`;
	const writer = await PdfFaceWriter.create(doc, {
		fonts: input.fonts ?? (await loadFonts()),
		images: input.images,
		colour: input.colour ?? 'cmyk',
		imageStore: input.imageStore,
		...(pdfx && { press: await pressOutput(pdfx, seed, input.onInkOver) })
	});
	for (const face of input.back ? [input.front, input.back] : [input.front]) {
		await drawPressPage(doc.addPage(), writer, face, !!input.cropMarks);
	}
	if (!pdfx) return doc.save();
	finishPdfx(doc, pdfx, { title: input.title ?? 'Card', date: stamp && !Number.isNaN(stamp.getTime()) ? stamp : new Date(), seed });
	return savePdfx(doc, pdfx.standard);
}

async function drawPressPage(page: PDFPage, writer: PdfFaceWriter, face: FaceLayout, cropMarks: boolean): Promise<void> {
	const boxes = pressBoxes(face, cropMarks);
	const { mediaBox: m, bleedBox: b, trimBox: t } = boxes;
	page.setSize(m.width, m.height);
	page.setMediaBox(m.x, m.y, m.width, m.height);
	page.setBleedBox(b.x, b.y, b.width, b.height);
	page.setTrimBox(t.x, t.y, t.width, t.height);
	// Clip to the bleed box: nothing of the face may spill onto the marks.
	await writer.drawFace(page, face, {
		xPt: b.x,
		yPt: b.y,
		clipPt: { xPt: b.x, yPt: b.y, widthPt: b.width, heightPt: b.height }
	});
	if (cropMarks) {
		drawSheetMarks(page, { lines: pressMarks(face), warnings: [] }, m.height / PT_PER_MM, {
			font: writer.font('regular'),
			labelColour: writer.paint({ hex: '#000000' })
		});
	}
}
