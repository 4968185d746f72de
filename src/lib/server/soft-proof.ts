/**
 * Soft proofs for the app: a card face of the working game, of a proof, or as typed in an editor,
 * as it will print on a press profile (a printer profile's, else the game's default, else the
 * built-in one). The drawing and the colour work are the print engine's (./print/soft-proof.ts).
 */
import type { Db } from './db';
import { artBytes, type PrintSource } from './printing';
import { findProfile, gamePressSummary, pressProfileOf } from './printer-profiles';
import { NotFound } from './refusals';
import type { Card, CardKind } from '$lib/game/model';
import { PressColour, type PressProfile } from '$lib/print/colour/cmm';
import { builtinPressProfile } from '$lib/print/colour/press-profiles';
import { loadFonts } from '$lib/print/fonts';
import { loadGameImages } from '$lib/print/job';
import { layoutFace } from '$lib/print/layout/index';
import { softProofFace, type SoftProof } from '$lib/print/soft-proof';
import type { SoftProofChoice } from '$lib/schemas/printing';

export interface CardSoftProof extends SoftProof {
	profileName: string;
	conditionIdentifier: string;
}

/** The press profile a soft proof uses, with its name for people. */
async function pressFor(db: Db, source: PrintSource, profileId: string | undefined): Promise<{ profile: PressProfile; name: string; condition: string }> {
	if (profileId) {
		const chosen = await findProfile(db, source.teamId, profileId);
		return { profile: await pressProfileOf(db, source.teamId, profileId), name: chosen.press.profileName, condition: chosen.press.conditionIdentifier };
	}
	const summary = await gamePressSummary(db, source.teamId, source.pressProfileId ?? null);
	const profile = source.pressProfileId && summary.printerProfile ? await pressProfileOf(db, source.teamId, source.pressProfileId) : await builtinPressProfile();
	return { profile, name: summary.profileName, condition: summary.conditionIdentifier };
}

/** One face of a card (saved, in a proof, or unsaved with its kind) soft-proofed. */
export async function softProofCard(db: Db, source: PrintSource, target: { kind: CardKind; card?: Card }, choice: SoftProofChoice): Promise<CardSoftProof> {
	const press = await pressFor(db, source, choice.profile);
	const colour = await PressColour.open(press.profile.icc, choice.intent);
	const { images } = await loadGameImages(source.game, await artBytes(source.game));
	const face = layoutFace({ game: source.game, kind: target.kind, card: target.card, side: choice.side, images, fonts: await loadFonts() });
	const proof = await softProofFace(face, images, { press: colour, thresholdDeltaE2000: choice.deltaE, mark: choice.marks });
	return { ...proof, profileName: press.name, conditionIdentifier: press.condition };
}

/** A saved card of the source (working game or proof) by id. */
export function cardOf(source: PrintSource, cardId: string): { kind: CardKind; card: Card } {
	const card = source.game.cards.find((c) => c.id === cardId);
	const kind = card && source.game.kinds.find((k) => k.id === card.kindId);
	if (!card || !kind) throw new NotFound('No such card');
	return { kind, card };
}
