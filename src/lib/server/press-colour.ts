/**
 * A press colour (CMYK %) proposed from a screen colour, through the built-in press profile.
 * Only a starting point: the print shop's own profile and proofs decide.
 */
import { PressColour } from '$lib/print/colour/cmm';
import { builtinPressProfile } from '$lib/print/colour/press-profiles';
import type { Cmyk } from '$lib/game/model';

export const PRESS_COLOUR_NOTE =
	'Converted from the screen colour through Paddock’s built-in coated-paper profile (FOGRA39): an approximation. Confirm press colours with your print shop before a paid run.';

export async function pressCmykOf(hex: string): Promise<Cmyk> {
	const press = await PressColour.open((await builtinPressProfile()).icc);
	const [c, m, y, k] = press.cmykOf(hex).map((v) => Math.round(v * 100));
	return { c, m, y, k };
}
