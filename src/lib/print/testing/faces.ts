/**
 * Synthetic faces for print tests: plain shapes and numbers, no game data. Each numbered face
 * fills its bleed box with a grey level of its own, so a raster shows which card landed where.
 */
import type { FaceLayout } from '../display-list';

export const POKER = { trimWidthMm: 63.5, trimHeightMm: 88.9 };

/** Distinct grey per number, from dark to light, never white. */
export function greyFor(n: number, count: number): number {
	return Math.round(40 + (n * 170) / Math.max(1, count - 1));
}

export function numberedFace(n: number, count: number, side: 'front' | 'back', size = POKER, bleedMm = 3): FaceLayout {
	const g = greyFor(n, count).toString(16).padStart(2, '0');
	const w = size.trimWidthMm + 2 * bleedMm;
	const h = size.trimHeightMm + 2 * bleedMm;
	return {
		trimWidthMm: size.trimWidthMm,
		trimHeightMm: size.trimHeightMm,
		bleedMm,
		safeMm: 5,
		warnings: [],
		items: [
			{ type: 'rect', xMm: 0, yMm: 0, wMm: w, hMm: h, fill: { hex: `#${g}${g}${g}` } },
			// A white corner block marks the face's top-left, so a mirrored or rotated face shows.
			{ type: 'rect', xMm: bleedMm + 4, yMm: bleedMm + 4, wMm: 10, hMm: 6, fill: { hex: '#ffffff' } },
			{
				type: 'text',
				xMm: bleedMm + 8,
				yMm: h / 2,
				text: `${side === 'front' ? 'Front' : 'Back'} ${n + 1}`,
				sizePt: 16,
				weight: 'bold',
				fill: { hex: '#ffffff' },
				widthMm: 30
			}
		]
	};
}
