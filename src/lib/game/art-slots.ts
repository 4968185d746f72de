/**
 * Words for art slots. A slot's name is the key layouts and CSV files use ("portrait", "backArt");
 * people see a label instead.
 */
import type { CardKind } from './model';

/** The slots every new kind starts with (./kind-defaults.ts), in words. */
const KNOWN: Record<string, string> = {
	portrait: 'Main picture',
	backArt: 'Card back',
	icon: 'Icon'
};

/** A slot's label: a known slot's words, else its name split into words ("flavourArt" → "Flavour art"). */
export function slotLabel(slot: string): string {
	const known = KNOWN[slot];
	if (known) return known;
	const words = slot
		.replace(/([a-z0-9])([A-Z])/g, '$1 $2')
		.replace(/[_-]+/g, ' ')
		.trim()
		.toLowerCase();
	return words ? words[0].toUpperCase() + words.slice(1) : slot;
}

/** The label, saying so when the slot is the back every card of the kind shares. */
export function slotLabelIn(kind: Pick<CardKind, 'back'>, slot: string): string {
	const sharedBack = kind.back.mode === 'shared' && kind.back.artSlot === slot;
	return sharedBack ? `${slotLabel(slot)} (shared by every card)` : slotLabel(slot);
}
