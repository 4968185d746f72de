/**
 * The PDF backend: draws one FaceLayout onto a pdf-lib page.
 *
 * The display list is in mm from the face's top-left, y downwards; PDF user space is in pt
 * from the page's bottom-left, y upwards (ISO 32000-1 §8.3.2.3), so every coordinate is
 * converted here and nowhere else. Text is vector text in the embedded Roboto Slab (TrueType,
 * subset); images are embedded once per document and drawn wherever they are used.
 */
import fontkit from '@pdf-lib/fontkit';
import {
	appendBezierCurve,
	clip,
	closePath,
	cmyk,
	concatTransformationMatrix,
	drawObject,
	endPath,
	LineJoinStyle,
	lineTo,
	moveTo,
	PDFDocument,
	PDFFont,
	PDFOperator,
	PDFPage,
	popGraphicsState,
	pushGraphicsState,
	rectangle,
	rgb,
	setLineJoin,
	type Color
} from 'pdf-lib';
import type { Colour, DisplayItem, FaceLayout, FontWeight, ImageAsset } from './display-list';
import { faceHeightMm, faceWidthMm } from './display-list';
import type { FontSet } from './fonts';
import { PT_PER_MM } from './paper';
import { PdfImageCache } from './pdf-image';

export type ColourMode = 'rgb' | 'cmyk';


/** Bézier handle length for a quarter circle: 4/3 · (√2 − 1). */
const KAPPA = 0.5522847498;

/** A rectangle in PDF user space (pt, bottom-left origin). */
export interface BoxPt {
	xPt: number;
	yPt: number;
	widthPt: number;
	heightPt: number;
}

export interface FacePlacement {
	/** Bottom-left corner of the face box (trim + bleed) on the page, in pt. */
	xPt: number;
	yPt: number;
	/** Draw only inside this box (butted layouts clip the inner bleed). */
	clipPt?: BoxPt;
}

/**
 * Device CMYK from sRGB hex by the plain complement formula. It is not colour-managed: it only
 * keeps a CMYK document free of RGB operators when a colour has no press value of its own.
 */
export function hexToCmyk(hex: string): [number, number, number, number] {
	const [r, g, b] = hexToRgb(hex);
	const k = 1 - Math.max(r, g, b);
	if (k >= 1) return [0, 0, 0, 1];
	return [(1 - r - k) / (1 - k), (1 - g - k) / (1 - k), (1 - b - k) / (1 - k), k];
}

export function hexToRgb(hex: string): [number, number, number] {
	let h = hex.trim().replace(/^#/, '');
	if (h.length === 3) h = [...h].map((c) => c + c).join('');
	if (!/^[0-9a-f]{6}$/i.test(h)) throw new Error(`not a hex colour: ${hex}`);
	const n = parseInt(h, 16);
	return [((n >> 16) & 255) / 255, ((n >> 8) & 255) / 255, (n & 255) / 255];
}

export function pdfColour(colour: Colour, mode: ColourMode): Color {
	if (mode === 'cmyk') {
		const [c, m, y, k] = colour.cmyk ?? hexToCmyk(colour.hex);
		return cmyk(c, m, y, k);
	}
	const [r, g, b] = hexToRgb(colour.hex);
	return rgb(r, g, b);
}

/** An SVG path for a rounded rectangle (mm, y down) — pdf-lib's rectangle has no corner radius. */
export function roundedRectPath(x: number, y: number, w: number, h: number, radius: number): string {
	const r = Math.max(0, Math.min(radius, w / 2, h / 2));
	const c = r * (1 - KAPPA);
	const n = (v: number) => +v.toFixed(4);
	return [
		`M ${n(x + r)} ${n(y)}`,
		`H ${n(x + w - r)}`,
		`C ${n(x + w - c)} ${n(y)} ${n(x + w)} ${n(y + c)} ${n(x + w)} ${n(y + r)}`,
		`V ${n(y + h - r)}`,
		`C ${n(x + w)} ${n(y + h - c)} ${n(x + w - c)} ${n(y + h)} ${n(x + w - r)} ${n(y + h)}`,
		`H ${n(x + r)}`,
		`C ${n(x + c)} ${n(y + h)} ${n(x)} ${n(y + h - c)} ${n(x)} ${n(y + h - r)}`,
		`V ${n(y + r)}`,
		`C ${n(x)} ${n(y + c)} ${n(x + c)} ${n(y)} ${n(x + r)} ${n(y)}`,
		'Z'
	].join(' ');
}

export interface PdfFaceWriterOptions {
	fonts: FontSet;
	/** Image table shared by all faces of the document, keyed by image id. */
	images?: Iterable<ImageAsset> | ReadonlyMap<string, ImageAsset>;
	colour?: ColourMode;
}

/**
 * Draws faces into one document. Holds what must be embedded once per document: the two
 * font weights and the images.
 */
export class PdfFaceWriter {
	readonly colour: ColourMode;
	readonly images: PdfImageCache;

	private constructor(
		readonly doc: PDFDocument,
		private fonts: Record<FontWeight, PDFFont>,
		images: ReadonlyMap<string, ImageAsset>,
		colour: ColourMode
	) {
		this.colour = colour;
		this.images = new PdfImageCache(doc, images);
	}

	static async create(doc: PDFDocument, options: PdfFaceWriterOptions): Promise<PdfFaceWriter> {
		doc.registerFontkit(fontkit);
		// Subset to the glyphs used; TrueType bytes, never woff2 (pdf-lib would write invisible glyphs).
		const [regular, bold] = await Promise.all([
			doc.embedFont(new Uint8Array(options.fonts.regular.ttf), { subset: true }),
			doc.embedFont(new Uint8Array(options.fonts.bold.ttf), { subset: true })
		]);
		const table = new Map<string, ImageAsset>();
		if (options.images instanceof Map) for (const [id, a] of options.images) table.set(id, a);
		else for (const a of (options.images ?? []) as Iterable<ImageAsset>) table.set(a.id, a);
		return new PdfFaceWriter(doc, { regular, bold }, table, options.colour ?? 'rgb');
	}

	font(weight: FontWeight): PDFFont {
		return this.fonts[weight];
	}

	paint(colour: Colour): Color {
		return pdfColour(colour, this.colour);
	}

	/** Draws the whole face with its bottom-left bleed corner at the placement (pt). */
	async drawFace(page: PDFPage, face: FaceLayout, at: FacePlacement): Promise<void> {
		const k = PT_PER_MM;
		const left = at.xPt;
		const top = at.yPt + faceHeightMm(face) * k;
		const X = (mm: number) => left + mm * k;
		const Y = (mm: number) => top - mm * k;
		const pathOrigin = { x: left, y: top, scale: k };

		if (at.clipPt) {
			const c = at.clipPt;
			page.pushOperators(pushGraphicsState(), rectangle(c.xPt, c.yPt, c.widthPt, c.heightPt), clip(), endPath());
		}
		for (const item of face.items) await this.drawItem(page, item, X, Y, pathOrigin);
		if (at.clipPt) page.pushOperators(popGraphicsState());
	}

	private async drawItem(
		page: PDFPage,
		item: DisplayItem,
		X: (mm: number) => number,
		Y: (mm: number) => number,
		pathOrigin: { x: number; y: number; scale: number }
	): Promise<void> {
		const k = PT_PER_MM;
		switch (item.type) {
			case 'rect': {
				const strokeMm = item.strokeMm ?? 0;
				// As in the SVG backend: a stroke needs both a colour and a width.
				const stroked = !!item.stroke && strokeMm > 0;
				if (!item.fill && !stroked) return;
				const fill = item.fill ? { color: this.paint(item.fill) } : {};
				if (item.radiusMm && item.radiusMm > 0) {
					// Path units are mm (drawSvgPath scales them), so the border width stays in mm.
					page.drawSvgPath(roundedRectPath(item.xMm, item.yMm, item.wMm, item.hMm, item.radiusMm), {
						...pathOrigin,
						...fill,
						...(stroked ? { borderColor: this.paint(item.stroke!), borderWidth: strokeMm } : {})
					});
				} else {
					page.drawRectangle({
						x: X(item.xMm),
						y: Y(item.yMm + item.hMm),
						width: item.wMm * k,
						height: item.hMm * k,
						...fill,
						...(stroked ? { borderColor: this.paint(item.stroke!), borderWidth: strokeMm * k } : {})
					});
				}
				return;
			}
			case 'ellipse': {
				const stroked = !!item.stroke && (item.strokeMm ?? 0) > 0;
				if (!item.fill && !stroked) return;
				page.drawEllipse({
					x: X(item.cxMm),
					y: Y(item.cyMm),
					xScale: item.rxMm * k,
					yScale: item.ryMm * k,
					...(item.fill ? { color: this.paint(item.fill) } : {}),
					...(stroked ? { borderColor: this.paint(item.stroke!), borderWidth: item.strokeMm! * k } : {})
				});
				return;
			}
			case 'line': {
				page.drawLine({
					start: { x: X(item.x1Mm), y: Y(item.y1Mm) },
					end: { x: X(item.x2Mm), y: Y(item.y2Mm) },
					thickness: item.strokeMm * k,
					color: this.paint(item.stroke),
					...(item.dashMm?.length ? { dashArray: item.dashMm.map((d) => d * k) } : {})
				});
				return;
			}
			case 'path': {
				const stroked = !!item.stroke && (item.strokeMm ?? 0) > 0;
				if (!item.fill && !stroked) return;
				// Round joins like the SVG backend; drawSvgPath inherits them from the enclosing state.
				page.pushOperators(pushGraphicsState(), setLineJoin(LineJoinStyle.Round));
				page.drawSvgPath(item.d, {
					...pathOrigin,
					...(item.fill ? { color: this.paint(item.fill) } : {}),
					...(stroked ? { borderColor: this.paint(item.stroke!), borderWidth: item.strokeMm! } : {})
				});
				page.pushOperators(popGraphicsState());
				return;
			}
			case 'text': {
				if (!item.text) return;
				page.drawText(item.text, {
					x: X(item.xMm),
					y: Y(item.yMm),
					size: item.sizePt,
					font: this.fonts[item.weight],
					color: this.paint(item.fill)
				});
				return;
			}
			case 'image': {
				const name = await this.images.nameOn(page, item.imageId);
				const ops: PDFOperator[] = [pushGraphicsState()];
				// Cover-fit images overhang their slot: clip to the slot (or the image's own box).
				const box = item.clip ?? item;
				ops.push(...roundedRectOps(X(box.xMm), Y(box.yMm + box.hMm), box.wMm * k, box.hMm * k, (item.radiusMm ?? 0) * k), clip(), endPath());
				// The image's unit square maps onto the box (ISO 32000-1 §8.9.5: images are drawn in the unit square).
				ops.push(concatTransformationMatrix(item.wMm * k, 0, 0, item.hMm * k, X(item.xMm), Y(item.yMm + item.hMm)), drawObject(name), popGraphicsState());
				page.pushOperators(...ops);
				return;
			}
		}
	}
}

/** Rounded rectangle path operators in pt (bottom-left x, y), for clipping. */
function roundedRectOps(x: number, y: number, w: number, h: number, radius: number): PDFOperator[] {
	const r = Math.max(0, Math.min(radius, w / 2, h / 2));
	const c = r * KAPPA;
	return [
		moveTo(x + r, y),
		lineTo(x + w - r, y),
		appendBezierCurve(x + w - r + c, y, x + w, y + r - c, x + w, y + r),
		lineTo(x + w, y + h - r),
		appendBezierCurve(x + w, y + h - r + c, x + w - r + c, y + h, x + w - r, y + h),
		lineTo(x + r, y + h),
		appendBezierCurve(x + r - c, y + h, x, y + h - r + c, x, y + h - r),
		lineTo(x, y + r),
		appendBezierCurve(x, y + r - c, x + r - c, y, x + r, y),
		closePath()
	];
}

/** The face box size in pt. */
export const faceSizePt = (face: FaceLayout) => ({
	widthPt: faceWidthMm(face) * PT_PER_MM,
	heightPt: faceHeightMm(face) * PT_PER_MM
});
