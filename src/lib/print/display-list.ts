/**
 * The display list: one card face as plain data, drawn by every backend (SVG, PDF, PNG).
 *
 * Coordinates are millimetres from the top-left corner of the face *including* bleed,
 * y growing downwards (as in SVG). The PDF backend flips y itself.
 * Text runs are already measured and wrapped by the layout (see ./text.ts): a backend
 * draws each run at its baseline and never re-flows it, so both backends agree.
 */

/** A colour for screen/home printing (hex) with the optional press value (CMYK, 0..1 each). */
export interface Colour {
	hex: string;
	cmyk?: readonly [number, number, number, number];
}

export type FontWeight = 'regular' | 'bold';

export interface RectItem {
	type: 'rect';
	xMm: number;
	yMm: number;
	wMm: number;
	hMm: number;
	radiusMm?: number;
	fill?: Colour;
	stroke?: Colour;
	strokeMm?: number;
}

export interface EllipseItem {
	type: 'ellipse';
	cxMm: number;
	cyMm: number;
	rxMm: number;
	ryMm: number;
	fill?: Colour;
	stroke?: Colour;
	strokeMm?: number;
}

export interface LineItem {
	type: 'line';
	x1Mm: number;
	y1Mm: number;
	x2Mm: number;
	y2Mm: number;
	stroke: Colour;
	strokeMm: number;
	dashMm?: readonly number[];
}

/** An SVG path (`d`, in mm, absolute commands M L H V C Q Z only) for symbols and patterns. */
export interface PathItem {
	type: 'path';
	d: string;
	fill?: Colour;
	stroke?: Colour;
	strokeMm?: number;
}

/** One measured line of text; `xMm` is the left end, `yMm` the baseline. */
export interface TextItem {
	type: 'text';
	xMm: number;
	yMm: number;
	text: string;
	sizePt: number;
	weight: FontWeight;
	fill: Colour;
	/** Width the layout measured with the font's metrics, kept for checks. */
	widthMm: number;
}

/** An image placed in a box; `imageId` keys the face's image table (content hash). */
export interface ImageItem {
	type: 'image';
	xMm: number;
	yMm: number;
	wMm: number;
	hMm: number;
	imageId: string;
	/** Clip to the box with rounded corners, like the frame around it. */
	radiusMm?: number;
	/**
	 * Clip to this box instead of the image's own (cover-fit: the image box is scaled to fill
	 * the slot and overhangs it; the slot clips it). `radiusMm` rounds this box's corners.
	 */
	clip?: { xMm: number; yMm: number; wMm: number; hMm: number };
}

export type DisplayItem = RectItem | EllipseItem | LineItem | PathItem | TextItem | ImageItem;

/** Encoded image bytes, shared by all faces that use them (embedded once per document). */
export interface ImageAsset {
	id: string;
	mime: 'image/png' | 'image/jpeg';
	bytes: Uint8Array;
	widthPx: number;
	heightPx: number;
}

export interface FaceLayout {
	/** Trim size. */
	trimWidthMm: number;
	trimHeightMm: number;
	/** Bleed on every side; the face box is trim + 2 × bleed. */
	bleedMm: number;
	/** Safe-area inset from the trim. */
	safeMm: number;
	/** Corner radius of the cut (round-cornered cards); guides draw the trim line with it. */
	cornerRadiusMm?: number;
	items: DisplayItem[];
	/** Things the designer should know: text that had to shrink past its minimum, overflow of the safe area. */
	warnings: string[];
}

export const faceWidthMm = (f: FaceLayout) => f.trimWidthMm + 2 * f.bleedMm;
export const faceHeightMm = (f: FaceLayout) => f.trimHeightMm + 2 * f.bleedMm;
