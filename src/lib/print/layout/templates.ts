/**
 * The built-in card layouts, kept as data in templates/cards/<id>.json: colours, type sizes,
 * frame, corner radius, which fields show and where the boxes sit (as fractions of the safe
 * area, so one layout serves every card size). A kind's `params` override these defaults.
 */
import type { CardKind, CardKindType } from '../../game/model';
import back from '../../../../templates/cards/back.json' with { type: 'json' };
import custom from '../../../../templates/cards/custom.json' with { type: 'json' };
import modifier from '../../../../templates/cards/modifier.json' with { type: 'json' };
import movement from '../../../../templates/cards/movement.json' with { type: 'json' };
import rogue from '../../../../templates/cards/rogue.json' with { type: 'json' };
import setup from '../../../../templates/cards/setup.json' with { type: 'json' };
import tileBack from '../../../../templates/cards/tile-back.json' with { type: 'json' };
import tileFront from '../../../../templates/cards/tile-front.json' with { type: 'json' };
import wager from '../../../../templates/cards/wager.json' with { type: 'json' };

/** The drawing modules a template can name. */
export const FACE_MODULES = [
	'movement',
	'rogue',
	'wager',
	'setup',
	'modifier',
	'custom',
	'tile-front',
	'tile-back',
	'back'
] as const;
export type FaceModule = (typeof FACE_MODULES)[number];

/** The card data each face module draws (the shared back draws none). */
export const MODULE_DATA: Record<FaceModule, CardKindType | undefined> = {
	movement: 'movement',
	rogue: 'rogue',
	wager: 'wager',
	setup: 'setup',
	modifier: 'modifier',
	custom: 'custom',
	'tile-front': 'tile',
	'tile-back': 'tile',
	back: undefined
};

/** The layout a kind uses when its own names none the engine knows. */
export const DEFAULT_FRONT_TEMPLATE: Record<CardKindType, string> = {
	movement: 'movement',
	rogue: 'rogue',
	wager: 'wager',
	setup: 'setup',
	modifier: 'modifier',
	custom: 'custom',
	tile: 'tile-front'
};

export interface CardTemplate {
	id: string;
	face: FaceModule;
	label: string;
	about: string;
	params: Record<string, unknown>;
}

const asTemplate = (id: string, t: Omit<CardTemplate, 'id' | 'face'> & { face: string }): CardTemplate => {
	if (!(FACE_MODULES as readonly string[]).includes(t.face)) throw new Error(`Layout ${id} names an unknown face module ${t.face}`);
	return { id, ...t, face: t.face as FaceModule };
};

export const TEMPLATES: ReadonlyMap<string, CardTemplate> = new Map(
	(
		[
			['movement', movement],
			['rogue', rogue],
			['wager', wager],
			['setup', setup],
			['modifier', modifier],
			['custom', custom],
			['tile-front', tileFront],
			['tile-back', tileBack],
			['back', back]
		] as const
	).map(([id, t]) => [id, asTemplate(id, t)])
);

/** A box as fractions of an area (0..1 each). */
export interface FracBox {
	x: number;
	y: number;
	w: number;
	h: number;
}

const kindOf = (v: unknown) => (v === null ? 'null' : Array.isArray(v) ? 'array' : typeof v);

/**
 * Overlay `overrides` on `defaults`, key by key. The template doubles as the schema: a value
 * whose type differs from the default's is ignored with a warning, so a bad parameter never
 * breaks a layout silently. Objects merge; arrays and plain values replace. Keys the template
 * does not know pass through (a module may read them).
 */
export function mergeParams<T extends Record<string, unknown>>(
	defaults: T,
	overrides: Record<string, unknown> | undefined,
	warn: (message: string) => void,
	path = ''
): T {
	const out: Record<string, unknown> = { ...defaults };
	for (const [key, value] of Object.entries(overrides ?? {})) {
		if (value === undefined) continue;
		const base = defaults[key];
		const where = path ? `${path}.${key}` : key;
		if (base === undefined) {
			out[key] = value;
			continue;
		}
		if (kindOf(base) !== kindOf(value)) {
			warn(`layout parameter ${where} should be a ${kindOf(base)}, not a ${kindOf(value)}; the default is used`);
			continue;
		}
		out[key] =
			kindOf(base) === 'object'
				? mergeParams(base as Record<string, unknown>, value as Record<string, unknown>, warn, where)
				: value;
	}
	return out as T;
}

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
