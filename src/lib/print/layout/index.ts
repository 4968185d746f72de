/**
 * Card layout: one face of one card → a display list (../display-list.ts) that every backend
 * draws the same way. The built-in layouts are data (templates/cards/*.json) and a kind's
 * `params` override them; each face module below draws one kind of face.
 */
import { bleedMm, safeMm, type Card, type CardData, type CardKind, type CardKindType } from '../../game/model';
import type { FaceLayout, ImageAsset } from '../display-list';
import type { MeasuringFonts } from '../typeface';
import { drawBack, type BackParams } from './back';
import type { FaceContext, LayoutGame } from './context';
import { drawCustom, type CustomParams } from './custom';
import { FaceBuilder, hex } from './face-builder';
import { drawModifier, type ModifierParams } from './modifier';
import { drawMovement, type MovementParams } from './movement';
import { drawRogue, type RogueParams } from './rogue';
import { drawSetup, type SetupParams } from './setup';
import { DEFAULT_FRONT_TEMPLATE, MODULE_DATA, mergeParams, TEMPLATES, type CardTemplate, type FaceModule } from './templates';
import { drawTileBack, drawTileFront, type TileParams } from './tile';
import { drawWager, type WagerParams } from './wager';

export { TEMPLATES, DEFAULT_FRONT_TEMPLATE, type CardTemplate, type FaceModule } from './templates';

export type Side = 'front' | 'back';

export type { LayoutGame } from './context';

export interface LayoutFaceInput {
	game: LayoutGame;
	kind: CardKind;
	/** The card; a shared back may be laid out without one. */
	card?: Card;
	side: Side;
	/** Loaded art by content hash (ImageAsset.id = ArtAsset.sha256). */
	images?: ReadonlyMap<string, ImageAsset>;
	/** From loadFonts(): text is measured with the fonts' own metrics. */
	fonts: MeasuringFonts;
}

type Draw = (ctx: FaceContext<never>, data: CardData | undefined) => void;

const MODULES: Record<FaceModule, Draw> = {
	movement: (ctx, d) => drawMovement(ctx as FaceContext<MovementParams>, d as Extract<CardData, { type: 'movement' }>),
	rogue: (ctx, d) => drawRogue(ctx as FaceContext<RogueParams>, d as Extract<CardData, { type: 'rogue' }>),
	wager: (ctx, d) => drawWager(ctx as FaceContext<WagerParams>, d as Extract<CardData, { type: 'wager' }>),
	setup: (ctx, d) => drawSetup(ctx as FaceContext<SetupParams>, d as Extract<CardData, { type: 'setup' }>),
	modifier: (ctx, d) => drawModifier(ctx as FaceContext<ModifierParams>, d as Extract<CardData, { type: 'modifier' }>),
	custom: (ctx, d) => drawCustom(ctx as FaceContext<CustomParams>, d as Extract<CardData, { type: 'custom' }>),
	'tile-front': (ctx, d) => drawTileFront(ctx as FaceContext<TileParams>, d as Extract<CardData, { type: 'tile' }>),
	'tile-back': (ctx, d) => drawTileBack(ctx as FaceContext<TileParams>, d as Extract<CardData, { type: 'tile' }>),
	back: (ctx) => drawBack(ctx as FaceContext<BackParams>)
};

function defaultTemplateId(kind: CardKind, side: Side): string {
	if (side === 'front') return DEFAULT_FRONT_TEMPLATE[kind.type];
	return kind.back.mode === 'per-card' ? 'tile-back' : 'back';
}

/** Which template draws this face, falling back (with a note) when the kind's cannot. */
function chooseTemplate(kind: CardKind, card: Card | undefined, side: Side, notes: string[]): CardTemplate {
	const wanted = side === 'front' ? kind.template : kind.back.template;
	let template = TEMPLATES.get(wanted);
	if (!template) {
		notes.push(`layout “${wanted}” is not a built-in layout; the default is used`);
		template = TEMPLATES.get(defaultTemplateId(kind, side))!;
	}
	const needs = MODULE_DATA[template.face];
	if (needs && card && card.data.type !== needs) {
		notes.push(`layout “${template.id}” draws ${needs} cards, not ${card.data.type}; the default is used`);
		template = TEMPLATES.get(defaultTemplateId(kind, side))!;
	}
	return template;
}

/**
 * The art slot a face shows: the one its params name, else the kind's first slot that is not
 * the shared back's (a per-card back, such as a tile's reverse side, shares the front's).
 */
function faceArtSlot(kind: CardKind, side: Side, params: Record<string, unknown>): string | undefined {
	const named = typeof params.artSlot === 'string' && kind.artSlots.includes(params.artSlot) ? params.artSlot : undefined;
	const backSlot = kind.back.mode === 'shared' ? kind.back.artSlot : undefined;
	if (side === 'back') return kind.back.mode === 'shared' ? backSlot : (named ?? kind.artSlots[0]);
	return named ?? kind.artSlots.find((s) => s !== backSlot);
}

/** Lay out one face of a card. Anything that did not fit is listed in `warnings`, never dropped silently. */
export function layoutFace(input: LayoutFaceInput): FaceLayout {
	const { game, kind, card, side, fonts } = input;
	const notes: string[] = [];
	const template = chooseTemplate(kind, card, side, notes);
	const overrides = side === 'front' ? kind.params : kind.back.params;
	const params = mergeParams(template.params, overrides, (m) => notes.push(m));

	const corner = typeof params.cornerRadiusMm === 'number' ? params.cornerRadiusMm : 0;
	const b = new FaceBuilder(
		fonts,
		{
			trimWidthMm: kind.size.widthMm,
			trimHeightMm: kind.size.heightMm,
			bleedMm: bleedMm(kind.bleed),
			safeMm: safeMm(kind.bleed),
			cornerRadiusMm: corner
		},
		`${kind.name}${card ? ` “${card.name}”` : ''} ${side}`
	);
	for (const n of notes) b.warn(n);

	const ctx: FaceContext = { b, game, kind, card, side, params, images: input.images, artSlot: faceArtSlot(kind, side, params) };

	const needs = MODULE_DATA[template.face];
	if (needs && (!card || card.data.type !== needs)) {
		// Nothing sensible to draw: a plain ground, and say why.
		b.warn(card ? `holds ${card.data.type} data, which no ${kind.type} layout draws` : `needs its card to draw this face`);
		b.decor({ type: 'rect', ...b.face, fill: hex('#f7f3ea') });
		return b.finish();
	}
	MODULES[template.face](ctx as FaceContext<never>, card?.data);
	return b.finish();
}

/** Both faces of a card. */
export function layoutCard(input: Omit<LayoutFaceInput, 'side'>): { front: FaceLayout; back: FaceLayout } {
	return { front: layoutFace({ ...input, side: 'front' }), back: layoutFace({ ...input, side: 'back' }) };
}
