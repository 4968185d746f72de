/**
 * Soft proof: a card face as it will print on a press profile, back on screen, so a reviewer
 * sees a dull green before the print shop does. The face is drawn as for the PNG files, every
 * pixel goes through the press profile and back (./colour/cmm.ts, LittleCMS), and colours that
 * move more than a threshold (CIEDE2000, ./colour/delta-e.ts) are striped in a warning colour.
 */
import type { FaceLayout } from './display-list';
import type { PressColour } from './colour/cmm';
import { GAMUT_WARNING_DELTA_E2000 } from './colour/delta-e';
import { decodePng } from './pdf-image';
import { renderFacePng, rgbaToPng } from './png';
import type { ImageSource } from './svg';

/** Screen previews: enough for a card on a page, a fraction of the print files' 300 dpi. */
export const SOFT_PROOF_DPI = 150;

/**
 * The stripes over moved colours: a vivid pink no press colour reaches (so a marked area
 * never looks like art), every other band of four pixels on the diagonal.
 */
export const GAMUT_MARK_RGB = [255, 0, 200] as const;
const BAND_PX = 4;

export interface SoftProofOptions {
	press: PressColour;
	dpi?: number;
	/** Mark colours moving more than this (ΔE2000); default GAMUT_WARNING_DELTA_E2000. */
	thresholdDeltaE2000?: number;
	/** Stripe the moved colours (default true); false shows the print look alone. */
	mark?: boolean;
}

export interface SoftProof {
	png: Uint8Array;
	widthPx: number;
	heightPx: number;
	thresholdDeltaE2000: number;
	/** Share of the face's pixels over the threshold, 0–1. */
	movedShare: number;
	/** The largest colour difference on the face (ΔE2000). */
	maxDeltaE2000: number;
}

/** Soft proof of RGB pixels: the print look, with moved colours striped. Returns RGBA. */
export function softProofPixels(
	rgb: Uint8Array,
	widthPx: number,
	heightPx: number,
	options: SoftProofOptions
): Omit<SoftProof, 'png'> & { rgba: Uint8Array } {
	const threshold = options.thresholdDeltaE2000 ?? GAMUT_WARNING_DELTA_E2000;
	const mark = options.mark ?? true;
	const { rgb: printed, deltaE2000 } = options.press.softProof(rgb);
	const rgba = new Uint8Array(widthPx * heightPx * 4);
	let moved = 0;
	let max = 0;
	for (let y = 0, i = 0; y < heightPx; y++) {
		for (let x = 0; x < widthPx; x++, i++) {
			const d = deltaE2000[i];
			if (d > max) max = d;
			const over = d > threshold;
			if (over) moved++;
			const stripe = mark && over && Math.floor((x + y) / BAND_PX) % 2 === 0;
			for (let c = 0; c < 3; c++) rgba[i * 4 + c] = stripe ? GAMUT_MARK_RGB[c] : printed[i * 3 + c];
			rgba[i * 4 + 3] = 255;
		}
	}
	return { rgba, widthPx, heightPx, thresholdDeltaE2000: threshold, movedShare: moved / (widthPx * heightPx), maxDeltaE2000: max };
}

/** One face (with bleed) soft-proofed as a PNG. Paper white stands behind transparent parts. */
export async function softProofFace(face: FaceLayout, images: ImageSource, options: SoftProofOptions): Promise<SoftProof> {
	const drawn = await renderFacePng(face, images, { dpi: options.dpi ?? SOFT_PROOF_DPI, background: '#ffffff' });
	const png = decodePng(drawn.png);
	if (!png) throw new Error('the face could not be read back for the soft proof');
	const rgb = png.channels === 3 ? png.colour : greyToRgb(png.colour);
	const proof = softProofPixels(rgb, png.widthPx, png.heightPx, options);
	const { rgba, ...figures } = proof;
	return { ...figures, png: rgbaToPng(rgba, proof.widthPx, proof.heightPx) };
}

function greyToRgb(grey: Uint8Array): Uint8Array {
	const rgb = new Uint8Array(grey.length * 3);
	for (let i = 0; i < grey.length; i++) rgb[i * 3] = rgb[i * 3 + 1] = rgb[i * 3 + 2] = grey[i];
	return rgb;
}

