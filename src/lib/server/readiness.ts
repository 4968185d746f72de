/**
 * A game's readiness list with its art measured where the layout really prints it (the same
 * measure as the art page), for the overview, the proof page and the proof record.
 */
import { readiness, type ArtSlotCheck } from '$lib/game/readiness';
import { artPrintChecks } from '$lib/art/placement';
import { loadFonts } from '$lib/print/fonts';
import type { Game } from '$lib/game/model';

export async function gameReadiness(game: Game) {
	const printed = new Map<string, ArtSlotCheck | undefined>();
	for (const [id, check] of artPrintChecks(game, await loadFonts())) {
		if (check.faces === 0) continue;
		const r = check.worst?.resolution;
		printed.set(id, r ? { dpi: r.dpi, ok: r.ok, aspectRatio: r.aspectRatio } : undefined);
	}
	return readiness(game, printed);
}
