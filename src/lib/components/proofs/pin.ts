/**
 * Where a click lands on a card face, in mm of the face box (trim + bleed, from the face's
 * top-left, as face.svg draws it and the API stores pins), and where a pin sits back on the page.
 */

/** CSS px per mm: 1in = 96px = 25.4mm (CSS Values and Units Module Level 3, §6.2 absolute lengths). */
export const CSS_PX_PER_MM = 96 / 25.4;

export interface Box {
	left: number;
	top: number;
	width: number;
	height: number;
}

/** The face's size in mm from an image of its SVG, whose width and height are given in mm. */
export const faceMmFromImage = (naturalWidthPx: number, naturalHeightPx: number) => ({
	widthMm: naturalWidthPx / CSS_PX_PER_MM,
	heightMm: naturalHeightPx / CSS_PX_PER_MM
});

const tenth = (v: number) => Math.round(v * 10) / 10;

/** A click at (clientX, clientY) on the face drawn in `box` (CSS px), in mm of a face of the given size. */
export function clickToMm(clientX: number, clientY: number, box: Box, face: { widthMm: number; heightMm: number }) {
	return {
		xMm: tenth(((clientX - box.left) / box.width) * face.widthMm),
		yMm: tenth(((clientY - box.top) / box.height) * face.heightMm)
	};
}

/** The centre of the face: where a pin placed from the keyboard starts. */
export const centreMm = (face: { widthMm: number; heightMm: number }) => ({ xMm: tenth(face.widthMm / 2), yMm: tenth(face.heightMm / 2) });

/** A pin's place on the drawn face, as CSS percentages of its box. */
export const pinPercent = (xMm: number, yMm: number, face: { widthMm: number; heightMm: number }) => ({
	left: (xMm / face.widthMm) * 100,
	top: (yMm / face.heightMm) * 100
});

export const insideFace = (xMm: number, yMm: number, face: { widthMm: number; heightMm: number }) =>
	xMm >= 0 && yMm >= 0 && xMm <= face.widthMm && yMm <= face.heightMm;
