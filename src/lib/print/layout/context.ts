/** What every face module receives: the data to draw, its merged layout parameters and a builder. */
import type { ImageAsset } from '../display-list';
import type { ArtAsset, Card, CardKind, Game } from '../../game/model';
import { drawArtSlot, findArt, imageFor } from './art';
import type { Box, FaceBuilder } from './face-builder';

/** What a face reads of its game: enough to lay out a card without the rest of the document. */
export type LayoutGame = Pick<Game, 'name' | 'runners' | 'rogueRunner' | 'moneyTables' | 'art'>;

export interface FaceContext<P = Record<string, unknown>> {
	b: FaceBuilder;
	game: LayoutGame;
	kind: CardKind;
	card?: Card;
	side: 'front' | 'back';
	params: P;
	images?: ReadonlyMap<string, ImageAsset>;
	/** The art slot this face shows, if the kind has one and the layout shows art. */
	artSlot?: string;
}

export interface SlotArt {
	slot: string;
	art?: ArtAsset;
	image?: ImageAsset;
}

/** The face's art slot with whatever is assigned to it (for a runner's card, the runner's art counts). */
export function slotArt(ctx: FaceContext, runnerId?: string): SlotArt | undefined {
	if (!ctx.artSlot) return undefined;
	const art = findArt(ctx.game, ctx.kind, ctx.card, runnerId, ctx.artSlot);
	return { slot: ctx.artSlot, art, image: imageFor(art, ctx.images) };
}

export function drawSlot(
	ctx: FaceContext<{ panelRadiusMm: number; mutedHex: string; inkHex: string; frameHex: string } & Record<string, unknown>>,
	box: Box,
	s: SlotArt,
	tintHex = '#ebe4d4'
) {
	drawArtSlot(ctx.b, box, s.slot, s.art, s.image, {
		radiusMm: ctx.params.panelRadiusMm,
		tintHex,
		lineHex: ctx.params.mutedHex,
		inkHex: ctx.params.inkHex
	});
}
