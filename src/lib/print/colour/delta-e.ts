/**
 * Colour difference for the soft proof: CIEDE2000 (CIE 142-2001; Sharma, Wu and Dalal, Color
 * Research and Application 30(1), 2005), through culori rather than a formula of our own.
 *
 * Why CIEDE2000 and not the older CIE 1976 distance (ΔE*ab): ΔE*ab overstates differences in
 * saturated colours and understates them in near-greys, so one threshold would flag half of a
 * bright card and miss a shifted beige. CIEDE2000 corrects for that, so one threshold means about
 * the same visible step everywhere.
 *
 * The formula only needs L*, a*, b*: the values given here are ICC PCS Lab (D50), as LittleCMS
 * returns them; they are handed to culori as its `lab65` mode only so it applies no white-point
 * adaptation before computing.
 */
import { differenceCiede2000 } from 'culori';

const ciede2000 = differenceCiede2000();

/**
 * The soft proof marks colours that move more than this (ΔE2000) between the art on screen and
 * the print. Common practice (values from memory, confirm against the trade's own tables): about
 * 1 is the smallest difference a trained eye sees side by side, 2–3 is the tolerance print buyers
 * and proofing checks usually accept, above 5 most people see a different colour. 3 keeps the
 * marks on colours a reviewer would call wrong, not on the rounding every conversion makes.
 */
export const GAMUT_WARNING_DELTA_E2000 = 3;
/** Bounds a caller may choose within. */
export const GAMUT_WARNING_MIN = 1;
export const GAMUT_WARNING_MAX = 20;

/** CIEDE2000 colour difference between two CIELAB colours [L*, a*, b*] (kL = kC = kH = 1). */
export function deltaE2000(a: ArrayLike<number>, b: ArrayLike<number>): number {
	return ciede2000({ mode: 'lab65', l: a[0], a: a[1], b: a[2] }, { mode: 'lab65', l: b[0], a: b[1], b: b[2] });
}
