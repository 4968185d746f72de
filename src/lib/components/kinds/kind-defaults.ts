/**
 * What a new card kind and a new card start with. Plain data in, plain data out: the kinds
 * pages, their actions and the tests all build new objects here.
 */
import { z } from 'zod';
import {
	CardKindSchema,
	newId,
	type Card,
	type CardData,
	type CardKind,
	type CardKindType,
	type Game,
	type Id
} from '$lib/game/model';
import { DEFAULT_FRONT_TEMPLATE, MODULE_DATA, TEMPLATES, type CardTemplate } from '$lib/print/layout/templates';

/** Layouts that can draw the front of a card of this type, the usual one first. */
export function frontTemplates(type: CardKindType): CardTemplate[] {
	const usual = DEFAULT_FRONT_TEMPLATE;
	return [...TEMPLATES.values()]
		.filter((t) => MODULE_DATA[t.face] === type)
		.sort((a, b) => Number(b.id === usual[type]) - Number(a.id === usual[type]));
}

/** Layouts for a back: the shared back draws no card data; a per-card back draws the card's own. */
export function backTemplates(type: CardKindType, mode: CardKind['back']['mode']): CardTemplate[] {
	if (mode === 'shared') return [...TEMPLATES.values()].filter((t) => MODULE_DATA[t.face] === undefined);
	return [...TEMPLATES.values()]
		.filter((t) => MODULE_DATA[t.face] === type)
		.sort((a, b) => Number(b.face === 'tile-back') - Number(a.face === 'tile-back'));
}

/** The new-kind form: the settings a designer picks first; the rest starts from the layouts. */
export const NewKindSchema = CardKindSchema.pick({ name: true, type: true, size: true, bleed: true, template: true }).superRefine(
	(k, ctx) => {
		if (!frontTemplates(k.type).some((t) => t.id === k.template))
			ctx.addIssue({ code: 'custom', path: ['template'], message: `That layout does not draw ${k.type} cards` });
	}
);
export type NewKind = z.infer<typeof NewKindSchema>;

/** Art slots per type, as the demo game uses them: a picture on the front, one on the shared back. */
const ART_SLOTS: Record<CardKindType, string[]> = {
	movement: ['portrait', 'backArt'],
	rogue: ['portrait', 'backArt'],
	wager: ['portrait', 'backArt'],
	setup: ['backArt'],
	modifier: ['icon', 'backArt'],
	custom: ['backArt'],
	tile: ['ground']
};

/**
 * A complete kind from the new-kind form. Layout parameters start empty, so the layout's own
 * colours, type sizes and frame apply until the designer changes them. Track tiles are
 * double-sided, so their back is drawn per card; every other kind shares one back.
 */
export function newKind(input: NewKind, id: Id = newId()): CardKind {
	const back: CardKind['back'] =
		input.type === 'tile'
			? { mode: 'per-card', template: 'tile-back', params: {} }
			: { mode: 'shared', template: 'back', params: {}, artSlot: 'backArt' };
	return {
		id,
		name: input.name,
		type: input.type,
		size: input.size,
		bleed: input.bleed,
		template: input.template,
		params: {},
		back,
		fields: input.type === 'custom' ? ['title', 'body'] : [],
		artSlots: [...ART_SLOTS[input.type]]
	};
}

/** The data a new card of the kind starts with: the first runner and table, the next tile number. */
export function blankCardData(kind: CardKind, game: Pick<Game, 'runners' | 'moneyTables' | 'cards'>): CardData {
	const runnerId = [...game.runners].sort((a, b) => a.sortOrder - b.sortOrder)[0]?.id ?? '';
	const ofKind = game.cards.filter((c) => c.kindId === kind.id);
	switch (kind.type) {
		case 'movement':
			return { type: 'movement', runnerId, steps: 1 };
		case 'rogue':
			return { type: 'rogue', steps: 1 };
		case 'wager':
			return { type: 'wager', betType: 'stage', runnerId, tier: 1, moneyTableId: game.moneyTables[0]?.id ?? '' };
		case 'setup': {
			const players = Math.max(1, ...ofKind.map((c) => (c.data.type === 'setup' ? c.data.players : 1))) + 1;
			return {
				type: 'setup',
				players: Math.min(players, 12),
				handSize: 5,
				discards: 0,
				toSharedDeck: 0,
				faceUp: 0,
				extraFromDeck: 0,
				trackLength: 12
			};
		}
		case 'modifier':
			return { type: 'modifier', name: '', effectText: '', steps: 1 };
		case 'custom':
			return { type: 'custom', values: Object.fromEntries(kind.fields.map((f) => [f, ''])) };
		case 'tile': {
			const number = Math.max(0, ...ofKind.map((c) => (c.data.type === 'tile' ? c.data.number : 0))) + 1;
			return { type: 'tile', number, role: 'normal', spacesFront: 3, spacesBack: 2, backLabel: '' };
		}
	}
}

export function blankCard(kind: CardKind, game: Pick<Game, 'runners' | 'moneyTables' | 'cards'>, id: Id = newId()): Card {
	return { id, kindId: kind.id, name: '', data: blankCardData(kind, game), copies: 1 };
}
