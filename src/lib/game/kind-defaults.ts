/**
 * What a new card kind and a new card start with. Plain data in, plain data out: the kinds
 * pages, their actions and the tests all build new objects here. The new-kind form's schema,
 * which also checks the chosen layout, is in $lib/schemas/kinds.
 */
import {
	newId,
	type Card,
	type CardData,
	type CardKind,
	type CardKindType,
	type Game,
	type Id
} from './model';

/** The settings the new-kind form asks for (validated by NewKindSchema in $lib/schemas/kinds). */
export type NewKindInput = Pick<CardKind, 'name' | 'type' | 'size' | 'bleed' | 'template'>;

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
export function newKind(input: NewKindInput, id: Id = newId()): CardKind {
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
