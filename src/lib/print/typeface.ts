/**
 * The one typeface of every card, as the layout measures it: Roboto Slab's own metrics, read
 * by fontkit straight from the shipped woff2 files. No Node import, so the same measuring runs
 * in the server and in the browser's live preview (fontkit decodes WOFF2 itself: the advance
 * widths and vertical metrics equal those of the decompressed TrueType the PDF embeds).
 */
import fontkit from '@pdf-lib/fontkit';
import type { FontWeight } from './display-list';

export { FONT_FAMILY, FONT_FILES } from './font-files';

export interface MeasuringFont {
	/** fontkit font, for measuring advance widths and metrics. */
	metrics: fontkit.Font;
}

/** What the layout needs of the fonts: their metrics, per weight. */
export type MeasuringFonts = Record<FontWeight, MeasuringFont>;

/** Measuring fonts from the woff2 bytes of both weights. */
export function measuringFonts(woff2: Record<FontWeight, Uint8Array>): MeasuringFonts {
	return {
		regular: { metrics: fontkit.create(woff2.regular) },
		bold: { metrics: fontkit.create(woff2.bold) }
	};
}
