/**
 * The game as data: one zod schema per thing, types inferred from them.
 *
 * Forms, API routes, CSV import and the game bundle all validate with these same schemas.
 * Nothing here touches the database or the framework: the schemas take data and return data.
 * Every editable object carries an optional integer `version`; the database layer uses it for
 * optimistic locking, the schemas only carry it.
 */
// Plain-language validation messages for every schema in the process.
import '../schemas/messages';
import { z } from 'zod';

/* ------------------------------------------------------------------ basics */

/** Ids are opaque strings: random (`newId()`) or deterministic from generators (`mv-…`). */
export const IdSchema = z
	.string()
	.min(1)
	.max(160)
	.regex(/^[A-Za-z0-9_.:-]+$/, 'Ids use letters, digits and _ . : - only');
export type Id = z.infer<typeof IdSchema>;

export function newId(): Id {
	return crypto.randomUUID();
}

export const VersionSchema = z.int().min(0).optional();

/** Screen / home-print colour, `#rrggbb` (lower or upper case). */
export const HexColourSchema = z.string().regex(/^#[0-9a-fA-F]{6}$/, 'Colour must look like #rrggbb');
export type HexColour = z.infer<typeof HexColourSchema>;

const percent = z.number().min(0).max(100);
/** Press colour as ink percentages, 0..100 each. */
export const CmykSchema = z.strictObject({ c: percent, m: percent, y: percent, k: percent });
export type Cmyk = z.infer<typeof CmykSchema>;

/** CMYK as fractions 0..1 in c, m, y, k order (what PDF colour operators take). */
export function cmykFractions(cmyk: Cmyk): [number, number, number, number] {
	return [cmyk.c / 100, cmyk.m / 100, cmyk.y / 100, cmyk.k / 100];
}

/**
 * Our own simple shapes, printed beside the colour so no runner is told apart by colour alone
 * (the game must work for colour-blind players).
 */
export const RUNNER_SYMBOLS = ['dot', 'triangle', 'square', 'diamond', 'star', 'cross', 'ring', 'bars'] as const;
export const RunnerSymbolSchema = z.enum(RUNNER_SYMBOLS);
export type RunnerSymbol = z.infer<typeof RunnerSymbolSchema>;

export const SlugSchema = z
	.string()
	.min(1)
	.max(60)
	.regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Slug uses lower-case letters, digits and single hyphens');

/* ----------------------------------------------------------------- runners */

/** A game has 3 to 8 runners (product brief). */
export const RUNNERS_MIN = 3;
export const RUNNERS_MAX = 8;

export const RunnerSchema = z.strictObject({
	id: IdSchema,
	name: z.string().trim().min(1).max(40),
	colourHex: HexColourSchema,
	cmyk: CmykSchema,
	symbol: RunnerSymbolSchema,
	sortOrder: z.int(),
	version: VersionSchema
});
export type Runner = z.infer<typeof RunnerSchema>;
/** What a runner looks like wherever it is shown: its name, colour and symbol. */
export type RunnerLook = Pick<Runner, 'id' | 'name' | 'colourHex' | 'symbol'>;

/** The wrong-way runner: like a runner, but outside the finishing order. */
export const RogueRunnerSchema = RunnerSchema.omit({ sortOrder: true });
export type RogueRunner = z.infer<typeof RogueRunnerSchema>;

/* ------------------------------------------------------------ money tables */

export const MoneyRowSchema = z.strictObject({
	place: z.int().min(1),
	/** Coins won (positive) or lost (negative) for finishing in this place. */
	coins: z.int()
});
export type MoneyRow = z.infer<typeof MoneyRowSchema>;

export const MoneyTableSchema = z.strictObject({
	id: IdSchema,
	name: z.string().trim().min(1).max(60),
	rows: z.array(MoneyRowSchema).max(RUNNERS_MAX + 4),
	/** Coins for every place not listed in `rows`; absent means unlisted places are not covered. */
	otherCoins: z.int().optional(),
	version: VersionSchema
});
export type MoneyTable = z.infer<typeof MoneyTableSchema>;

export interface MoneyTableProblem {
	kind: 'uncovered' | 'duplicate' | 'unreachable';
	place: number;
	/** 'error' makes the table unusable; 'warning' is worth a look (a row that can never pay). */
	severity: 'error' | 'warning';
	message: string;
}

export interface MoneyTableCheck {
	ok: boolean;
	problems: MoneyTableProblem[];
}

/**
 * Every finishing place 1..runnerCount must be covered, by a row or by `otherCoins`;
 * a place listed twice is an error; a place beyond the field can never pay (warning).
 */
export function validateMoneyTable(table: MoneyTable, runnerCount: number): MoneyTableCheck {
	const problems: MoneyTableProblem[] = [];
	const seen = new Map<number, number>();
	for (const row of table.rows) seen.set(row.place, (seen.get(row.place) ?? 0) + 1);
	for (const [place, count] of [...seen].sort((a, b) => a[0] - b[0])) {
		if (count > 1)
			problems.push({
				kind: 'duplicate',
				place,
				severity: 'error',
				message: `“${table.name}”: place ${place} is listed ${count} times`
			});
		if (place > runnerCount)
			problems.push({
				kind: 'unreachable',
				place,
				severity: 'warning',
				message: `“${table.name}”: place ${place} can never happen with ${runnerCount} runners`
			});
	}
	if (table.otherCoins === undefined) {
		for (let place = 1; place <= runnerCount; place++) {
			if (!seen.has(place))
				problems.push({
					kind: 'uncovered',
					place,
					severity: 'error',
					message: `“${table.name}”: place ${place} has no coins (add a row or set coins for other places)`
				});
		}
	}
	return { ok: !problems.some((p) => p.severity === 'error'), problems };
}

/** Coins a table pays for a finishing place, or undefined when the place is not covered. */
export function coinsForPlace(table: MoneyTable, place: number): number | undefined {
	return table.rows.find((r) => r.place === place)?.coins ?? table.otherCoins;
}

/* -------------------------------------------------------------- card sizes */

export const CARD_SIZE_PRESETS = ['poker', 'bridge', 'mini', 'tarot', 'square', 'custom'] as const;
export type CardSizePreset = (typeof CARD_SIZE_PRESETS)[number];

/**
 * Trim sizes in mm, portrait. Common practice among card printers; there is no formal standard,
 * so users should confirm with their own print shop. poker 2.5 × 3.5 in, bridge 2.25 × 3.5 in.
 */
export const CARD_SIZES: Record<Exclude<CardSizePreset, 'custom'>, { widthMm: number; heightMm: number }> = {
	poker: { widthMm: 63.5, heightMm: 88.9 },
	bridge: { widthMm: 57.15, heightMm: 88.9 },
	mini: { widthMm: 44, heightMm: 68 },
	tarot: { widthMm: 70, heightMm: 120 },
	square: { widthMm: 70, heightMm: 70 }
};

/** Largest custom trim we accept: a card must fit an A3 sheet (ISO 216: 297 × 420 mm). */
export const CARD_MAX_MM = 420;

export const CardSizeSchema = z
	.strictObject({
		preset: z.enum(CARD_SIZE_PRESETS),
		widthMm: z.number().positive().max(CARD_MAX_MM),
		heightMm: z.number().positive().max(CARD_MAX_MM)
	})
	.superRefine((size, ctx) => {
		if (size.preset === 'custom') return;
		const p = CARD_SIZES[size.preset];
		const same = (a: number, b: number) => Math.abs(a - b) < 1e-6;
		// A preset may be used portrait or landscape (track tiles are often landscape).
		const fits =
			(same(size.widthMm, p.widthMm) && same(size.heightMm, p.heightMm)) ||
			(same(size.widthMm, p.heightMm) && same(size.heightMm, p.widthMm));
		if (!fits)
			ctx.addIssue({
				code: 'custom',
				path: ['widthMm'],
				message: `A ${size.preset} card is ${p.widthMm} × ${p.heightMm} mm; choose “custom” for other sizes`
			});
	});
export type CardSize = z.infer<typeof CardSizeSchema>;

export function cardSize(preset: Exclude<CardSizePreset, 'custom'>, landscape = false): CardSize {
	const p = CARD_SIZES[preset];
	return landscape
		? { preset, widthMm: p.heightMm, heightMm: p.widthMm }
		: { preset, widthMm: p.widthMm, heightMm: p.heightMm };
}

/* ------------------------------------------------------------ bleed / safe */

export const BleedStandardSchema = z.enum(['metric', 'us']);
export type BleedStandard = z.infer<typeof BleedStandardSchema>;

/** 1 inch = 25.4 mm exactly (international yard and pound agreement, 1959). */
export const MM_PER_INCH = 25.4;

/** Bleed per side: 3 mm metric, 1/8 in = 3.175 mm US (common practice). */
export function bleedMm(standard: BleedStandard): number {
	return standard === 'us' ? MM_PER_INCH / 8 : 3;
}

/** Safe-area inset from the trim: 1/8 in US; 5 mm for text in metric practice (common practice). */
export function safeMm(standard: BleedStandard): number {
	return standard === 'us' ? MM_PER_INCH / 8 : 5;
}

/* -------------------------------------------------------------- card kinds */

export const CARD_KIND_TYPES = ['movement', 'rogue', 'wager', 'setup', 'modifier', 'custom', 'tile'] as const;
export const CardKindTypeSchema = z.enum(CARD_KIND_TYPES);
export type CardKindType = z.infer<typeof CardKindTypeSchema>;

/** Id of a built-in layout the print engine knows (e.g. 'movement', 'wager', 'tile-front'). */
export const TemplateIdSchema = z.string().regex(/^[a-z0-9][a-z0-9-]{0,59}$/, 'Unknown layout id');

/** A field or art-slot name: short, used as a CSV column and a layout key. */
export const FieldNameSchema = z
	.string()
	.regex(/^[A-Za-z][A-Za-z0-9_]{0,39}$/, 'Field names start with a letter and use letters, digits, _');

/**
 * Layout parameters the print engine reads. The common ones are typed; a layout may read
 * others, so the object stays open (unknown keys pass through untouched).
 */
export const LayoutParamsSchema = z.looseObject({
	backgroundHex: HexColourSchema.optional(),
	inkHex: HexColourSchema.optional(),
	accentHex: HexColourSchema.optional(),
	frameHex: HexColourSchema.optional(),
	/** Frame line width inside the trim; 0 for none. */
	frameMm: z.number().min(0).max(20).optional(),
	cornerRadiusMm: z.number().min(0).max(30).optional(),
	titlePt: z.number().min(4).max(96).optional(),
	bodyPt: z.number().min(4).max(72).optional(),
	/** Which fields the layout shows, by field key (absent means the layout's default). */
	show: z.record(z.string(), z.boolean()).optional()
});
export type LayoutParams = z.infer<typeof LayoutParamsSchema>;

/**
 * A kind's back. Most kinds share one back; track tiles are double-sided, so each card's
 * back is drawn from that card's own data ('per-card').
 */
export const CardBackSchema = z.discriminatedUnion('mode', [
	z.strictObject({
		mode: z.literal('shared'),
		template: TemplateIdSchema,
		params: LayoutParamsSchema,
		/** Art slot (of the kind) printed on the back, if any. */
		artSlot: FieldNameSchema.optional()
	}),
	z.strictObject({
		mode: z.literal('per-card'),
		template: TemplateIdSchema,
		params: LayoutParamsSchema
	})
]);
export type CardBack = z.infer<typeof CardBackSchema>;

export const CardKindSchema = z.strictObject({
	id: IdSchema,
	name: z.string().trim().min(1).max(60),
	type: CardKindTypeSchema,
	size: CardSizeSchema,
	bleed: BleedStandardSchema,
	template: TemplateIdSchema,
	params: LayoutParamsSchema,
	back: CardBackSchema,
	/** Field names of custom cards (the keys of `data.values`); empty for other types. */
	fields: z.array(FieldNameSchema).max(40),
	artSlots: z.array(FieldNameSchema).max(20),
	version: VersionSchema
});
export type CardKind = z.infer<typeof CardKindSchema>;

/* --------------------------------------------------------------- card data */

export const BET_TYPES = ['stage', 'winner', 'loser'] as const;
export const BetTypeSchema = z.enum(BET_TYPES);
export type BetType = z.infer<typeof BetTypeSchema>;

export const TILE_ROLES = ['start', 'normal', 'finish'] as const;
export const TileRoleSchema = z.enum(TILE_ROLES);
export type TileRole = z.infer<typeof TileRoleSchema>;

const count = z.int().min(0).max(999);

export const MovementDataSchema = z.strictObject({
	type: z.literal('movement'),
	runnerId: IdSchema,
	steps: z.int().min(1).max(9)
});
/** The wrong-way runner's move: it goes back `steps` spaces. */
export const RogueDataSchema = z.strictObject({
	type: z.literal('rogue'),
	steps: z.int().min(1).max(9)
});
export const WagerDataSchema = z.strictObject({
	type: z.literal('wager'),
	betType: BetTypeSchema,
	runnerId: IdSchema,
	/** 1 is taken first and wins most; later tiers pay less. */
	tier: z.int().min(1).max(12),
	moneyTableId: IdSchema
});
/**
 * One per player count: the deal table and the track length. Every count is taken from the
 * movement deck (movement and rogue cards shuffled together) at the start of a stage.
 */
export const SetupDataSchema = z.strictObject({
	type: z.literal('setup'),
	players: z.int().min(2).max(12),
	/** Cards dealt to each player. */
	handSize: count,
	/** Cards set aside face down, out of the stage. */
	discards: count,
	/** Cards dealt straight into the shared deck. */
	toSharedDeck: count,
	/** Cards laid face up beside the track for everyone to see (not in the shared deck). */
	faceUp: count,
	/** Cards added from the remaining deck to the shared deck once the hands are dealt. */
	extraFromDeck: count,
	/** Number of track tiles laid, start and finish included. */
	trackLength: z.int().min(2).max(99),
	/**
	 * Rogue cards added to each stage's shared deck. Absent or 0: the rogue cards are shuffled into
	 * the movement deck and dealt like any other card; above 0: they are kept apart and this many
	 * join the shared deck.
	 */
	rogueToDeck: z.int().min(0).max(99).optional()
});
export const ModifierDataSchema = z.strictObject({
	type: z.literal('modifier'),
	name: z.string().trim().min(1).max(40),
	effectText: z.string().trim().max(240),
	/** Spaces a runner landing here moves on (+) or back (−). */
	steps: z.int().min(-9).max(9)
});
export const CustomDataSchema = z.strictObject({
	type: z.literal('custom'),
	values: z.record(z.string(), z.string().max(2000))
});
/** A numbered double-sided track tile. */
export const TileDataSchema = z.strictObject({
	type: z.literal('tile'),
	number: z.int().min(1).max(999),
	role: TileRoleSchema,
	spacesFront: z.int().min(0).max(20),
	spacesBack: z.int().min(0).max(20),
	/** What the reverse side is called on the tile, e.g. a narrowed side with fewer spaces. */
	backLabel: z.string().trim().max(40)
});

export const CardDataSchema = z.discriminatedUnion('type', [
	MovementDataSchema,
	RogueDataSchema,
	WagerDataSchema,
	SetupDataSchema,
	ModifierDataSchema,
	CustomDataSchema,
	TileDataSchema
]);
export type CardData = z.infer<typeof CardDataSchema>;
export type MovementData = z.infer<typeof MovementDataSchema>;
export type RogueData = z.infer<typeof RogueDataSchema>;
export type WagerData = z.infer<typeof WagerDataSchema>;
export type SetupData = z.infer<typeof SetupDataSchema>;
export type ModifierData = z.infer<typeof ModifierDataSchema>;
export type CustomData = z.infer<typeof CustomDataSchema>;
export type TileData = z.infer<typeof TileDataSchema>;

/** The data schema for one kind type (used by CSV import and forms). */
export const CARD_DATA_SCHEMAS = {
	movement: MovementDataSchema,
	rogue: RogueDataSchema,
	wager: WagerDataSchema,
	setup: SetupDataSchema,
	modifier: ModifierDataSchema,
	custom: CustomDataSchema,
	tile: TileDataSchema
} as const satisfies Record<CardKindType, z.ZodType>;

export type CardDataOf<T extends CardKindType> = Extract<CardData, { type: T }>;

/**
 * One card design. `copies` is how many of it are printed (and sit in the deck);
 * it lives here once, not inside `data`. `data.type` must equal its kind's `type`.
 */
export const CardSchema = z.strictObject({
	id: IdSchema,
	kindId: IdSchema,
	name: z.string().trim().min(1).max(80),
	data: CardDataSchema,
	copies: z.int().min(0).max(999),
	version: VersionSchema
});
export type Card = z.infer<typeof CardSchema>;

/* --------------------------------------------------------------------- art */

export const ART_MIMES = ['image/png', 'image/jpeg', 'image/svg+xml'] as const;
export const ArtMimeSchema = z.enum(ART_MIMES);
export type ArtMime = z.infer<typeof ArtMimeSchema>;

export const ART_EXTENSIONS: Record<ArtMime, string> = {
	'image/png': 'png',
	'image/jpeg': 'jpg',
	'image/svg+xml': 'svg'
};

export const ArtStatusSchema = z.enum(['placeholder', 'sketch', 'final']);
export type ArtStatus = z.infer<typeof ArtStatusSchema>;

export const ArtAssignmentSchema = z.strictObject({
	/** A runner's art (its portrait on every card of that runner), a kind's, or one card's. */
	scope: z.enum(['runner', 'kind', 'card']),
	targetId: IdSchema,
	slot: FieldNameSchema
});
export type ArtAssignment = z.infer<typeof ArtAssignmentSchema>;

export const Sha256Schema = z.string().regex(/^[0-9a-f]{64}$/, 'sha256 is 64 lower-case hex digits');

export const ArtAssetSchema = z.strictObject({
	id: IdSchema,
	sha256: Sha256Schema,
	mime: ArtMimeSchema,
	widthPx: z.int().min(1),
	heightPx: z.int().min(1),
	dpiX: z.number().positive().optional(),
	dpiY: z.number().positive().optional(),
	status: ArtStatusSchema,
	fileName: z.string().min(1).max(255),
	/** null while uploaded but not yet placed in a slot. */
	assignment: ArtAssignmentSchema.nullable(),
	version: VersionSchema
});
export type ArtAsset = z.infer<typeof ArtAssetSchema>;

/* -------------------------------------------------------------- race rules */

/**
 * The numbers of the movement model that vary between designs (the odds lab reads them).
 * A game without its own rules uses these defaults.
 */
export const RaceRulesSchema = z.strictObject({
	/** Extra spaces the rogue moves when anyone rides on it. */
	rogueCarryBonus: z.int().min(0).max(9).default(1),
	/** A modifier acts once and is then removed from the track. */
	modifiersOneUse: z.boolean().default(true),
	/** A modifier that moves a group back slides it under the stack there (else on top). */
	backUnder: z.boolean().default(true)
});
export type RaceRules = z.infer<typeof RaceRulesSchema>;
export const DEFAULT_RACE_RULES: RaceRules = { rogueCarryBonus: 1, modifiersOneUse: true, backUnder: true };

/* -------------------------------------------------------------------- game */

export const GAME_FORMAT_VERSION = 1;

export const GameSchema = z.strictObject({
	formatVersion: z.literal(GAME_FORMAT_VERSION),
	name: z.string().trim().min(1).max(80),
	slug: SlugSchema,
	bleedStandard: BleedStandardSchema,
	defaultSize: CardSizeSchema,
	runners: z.array(RunnerSchema).max(RUNNERS_MAX),
	rogueRunner: RogueRunnerSchema.optional(),
	moneyTables: z.array(MoneyTableSchema),
	kinds: z.array(CardKindSchema),
	cards: z.array(CardSchema),
	art: z.array(ArtAssetSchema),
	/** Absent: DEFAULT_RACE_RULES. */
	raceRules: RaceRulesSchema.optional(),
	version: VersionSchema
});
export type Game = z.infer<typeof GameSchema>;

/* ------------------------------------------------------ cross-references */

export interface ReferenceProblem {
	/** Where, as a readable path: `cards[3].data.runnerId`. */
	path: string;
	message: string;
}

/**
 * What a schema alone cannot see: duplicate ids and names, cards pointing at missing kinds,
 * runners or money tables, card data of the wrong type for its kind, art assigned to nothing.
 * Each of these breaks something (rendering, CSV by name, import); softer advice such as too
 * few runners belongs to the deck check.
 */
export function findReferenceProblems(game: Game): ReferenceProblem[] {
	const problems: ReferenceProblem[] = [];
	const dupes = (list: { id: string }[], where: string) => {
		const seen = new Set<string>();
		list.forEach((item, i) => {
			if (seen.has(item.id)) problems.push({ path: `${where}[${i}].id`, message: `Id “${item.id}” is used twice` });
			seen.add(item.id);
		});
	};
	dupes(game.runners, 'runners');
	dupes(game.moneyTables, 'moneyTables');
	dupes(game.kinds, 'kinds');
	dupes(game.cards, 'cards');
	dupes(game.art, 'art');

	const runnerNames = new Set<string>();
	game.runners.forEach((r, i) => {
		const key = r.name.toLowerCase();
		if (runnerNames.has(key)) problems.push({ path: `runners[${i}].name`, message: `Two runners are called “${r.name}”` });
		runnerNames.add(key);
	});

	const runners = new Set(game.runners.map((r) => r.id));
	const tables = new Set(game.moneyTables.map((t) => t.id));
	const kinds = new Map(game.kinds.map((k) => [k.id, k]));
	const cards = new Set(game.cards.map((c) => c.id));

	const cardNames = new Map<string, Set<string>>();
	game.cards.forEach((card, i) => {
		const kind = kinds.get(card.kindId);
		if (!kind) {
			problems.push({ path: `cards[${i}].kindId`, message: `Card “${card.name}” belongs to a missing card kind` });
			return;
		}
		const names = cardNames.get(kind.id) ?? new Set<string>();
		if (names.has(card.name))
			problems.push({ path: `cards[${i}].name`, message: `“${kind.name}” has two cards called “${card.name}”` });
		names.add(card.name);
		cardNames.set(kind.id, names);
		if (card.data.type !== kind.type) {
			problems.push({
				path: `cards[${i}].data.type`,
				message: `Card “${card.name}” holds ${card.data.type} data but its kind is ${kind.type}`
			});
			return;
		}
		const d = card.data;
		if ((d.type === 'movement' || d.type === 'wager') && !runners.has(d.runnerId))
			problems.push({ path: `cards[${i}].data.runnerId`, message: `Card “${card.name}” names a missing runner` });
		if (d.type === 'wager' && !tables.has(d.moneyTableId))
			problems.push({ path: `cards[${i}].data.moneyTableId`, message: `Card “${card.name}” names a missing money table` });
		if (d.type === 'rogue' && !game.rogueRunner)
			problems.push({ path: `cards[${i}]`, message: `Card “${card.name}” moves a rogue runner the game does not have` });
		if (d.type === 'custom')
			for (const key of Object.keys(d.values))
				if (!kind.fields.includes(key))
					problems.push({
						path: `cards[${i}].data.values.${key}`,
						message: `Card “${card.name}” has a value for “${key}”, which is not a field of “${kind.name}”`
					});
	});

	game.art.forEach((a, i) => {
		const as = a.assignment;
		if (!as) return;
		const exists =
			as.scope === 'runner'
				? runners.has(as.targetId) || game.rogueRunner?.id === as.targetId
				: as.scope === 'kind'
					? kinds.has(as.targetId)
					: cards.has(as.targetId);
		if (!exists)
			problems.push({ path: `art[${i}].assignment`, message: `Art “${a.fileName}” is assigned to a missing ${as.scope}` });
	});
	return problems;
}
