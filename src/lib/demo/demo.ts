/**
 * The demo game: “The Marrowbed Derby”, a garden-snail race of our own invention.
 *
 * Every name, colour, payout, count and rule text here is made up for the demo, and every number
 * that changes the odds was set by running the odds lab on the demo's own rules (the figures are
 * beside each number; `DEMO_ODDS_SCENARIOS` are the start-of-stage positions it was priced on).
 * It exercises each part of the model: six snails and a backwards-crawling beetle, money tables
 * for three bet types (two stage tiers, four race-end tiers), a movement matrix with uneven
 * copies, double-sided track tiles with a narrowed reverse side, a setup card for 2 to 8 players
 * whose deal fits the deck, hazard tokens, a player aid and card backs.
 * `demoGame()` has no art; `demoGameWithArt()` in ./demo-art adds the rendered illustrations.
 */
import { generateMovementCards, generateRogueCards, generateTiles, generateWagerCards } from '../game/generate';
import {
	cardSize,
	GAME_FORMAT_VERSION,
	type Card,
	type CardKind,
	type Game,
	type MoneyTable,
	type RogueRunner,
	type Runner,
	type SetupData,
	type BetType
} from '../game/model';

/** Warm and cool colours kept far apart, each with its own symbol for colour-blind players. */
export const DEMO_RUNNERS: Runner[] = [
	{ id: 'rn-rosehip', name: 'Rosehip', colourHex: '#cf4a6b', cmyk: { c: 0, m: 72, y: 45, k: 8 }, symbol: 'dot', sortOrder: 1 },
	{ id: 'rn-saffron', name: 'Saffron', colourHex: '#e0b12a', cmyk: { c: 0, m: 25, y: 88, k: 8 }, symbol: 'triangle', sortOrder: 2 },
	{ id: 'rn-sorrel', name: 'Sorrel', colourHex: '#8cb33b', cmyk: { c: 40, m: 5, y: 85, k: 15 }, symbol: 'square', sortOrder: 3 },
	{ id: 'rn-pebble', name: 'Pebble', colourHex: '#6e7f8d', cmyk: { c: 45, m: 25, y: 15, k: 30 }, symbol: 'diamond', sortOrder: 4 },
	{ id: 'rn-bramble', name: 'Bramble', colourHex: '#6a3564', cmyk: { c: 45, m: 80, y: 20, k: 35 }, symbol: 'star', sortOrder: 5 },
	{ id: 'rn-marigold', name: 'Marigold', colourHex: '#e6772e', cmyk: { c: 0, m: 60, y: 88, k: 5 }, symbol: 'ring', sortOrder: 6 }
];

/** A bronze-green ground beetle that crawls the wrong way and carries any snail riding on it. */
export const DEMO_ROGUE: RogueRunner = {
	id: 'rn-burrowback',
	name: 'Burrowback',
	colourHex: '#23706b',
	cmyk: { c: 80, m: 20, y: 50, k: 45 },
	symbol: 'cross'
};

/* ------------------------------------------------------------------ the rules */

/**
 * Each snail's movement cards, steps → copies: mostly slow (three 1s and three 2s) with one
 * 4-step glide. Seven cards a snail, 13 steps, 1.86 a card: a snail that gets its glide in a
 * stage jumps clear, so the stage favourite is never safe.
 */
export const DEMO_SNAIL_CARDS: Readonly<Record<number, number>> = { 1: 3, 2: 3, 4: 1 };

/** The beetle's cards, kept apart from the snails' deck: two “back 2” and one “back 3”. */
export const DEMO_BEETLE_CARDS: Readonly<Record<number, number>> = { 2: 2, 3: 1 };

/**
 * The movement model's numbers. A beetle carrying snails crawls 2 spaces further: riding it is
 * a real risk. Hazards act once and are lifted; a hazard that sends a group back slips it under.
 */
export const DEMO_RACE_RULES = { rogueCarryBonus: 2, modifiersOneUse: true, backUnder: true } as const;

/* --------------------------------------------------------------- money tables */

const table = (id: string, name: string, rows: [number, number][], otherCoins?: number): MoneyTable => ({
	id,
	name,
	rows: rows.map(([place, coins]) => ({ place, coins })),
	...(otherCoins === undefined ? {} : { otherCoins })
});

/**
 * The targets the tables were priced to (expected coins of one card; bands are what the pricing
 * test accepts). Stage tables: the card on the snail leading when the stage starts is worth about
 * +1 coin to the first taker and +0.4 to the second, so reading the track pays, while a pick at
 * random loses (every stage table averages below 0 over the six places). Race tables: taken at
 * the start, when every snail's chance is alike, the first pick is worth +1/2 a coin and each
 * later pick 1/3 of a coin less, so waiting for information costs something.
 */
export const DEMO_TABLE_TARGETS: Record<string, { betType: BetType; tier: number; target: number; band: readonly [number, number] }> = {
	'mt-stage-1': { betType: 'stage', tier: 1, target: 1, band: [0.7, 1.3] },
	'mt-stage-2': { betType: 'stage', tier: 2, target: 0.4, band: [0.1, 0.7] },
	...Object.fromEntries(
		(['winner', 'loser'] as const).flatMap((betType) =>
			[0.5, 1 / 6, -1 / 6, -0.5].map((target, i) => [
				`mt-${betType}-${i + 1}`,
				{ betType, tier: i + 1, target, band: [target - 0.2, target + 0.2] as const }
			])
		)
	)
};

/**
 * Two stage tiers, four race tiers. Figures from `npm run odds:demo` (4-player setup card; see
 * ./pricing for the method):
 *
 * - Stage: the leader at the start of each of the five led positions below, 400 seeded deals ×
 *   2,000 orders each, finishes 1st … 6th with 31.0 / 24.1 / 19.3 / 14.1 / 8.3 / 3.1 % (standard
 *   errors ≤ 0.4 points). A leader is far from safe: 45 % of the time it ends the stage 3rd or
 *   worse, because one 4-step glide or a carried stack overtakes it.
 * - Race: 100,000 whole races (seed 1). Each snail wins 16.6–16.8 % and comes last 16.5–16.8 %
 *   of races (1/6 each, as it must be with every snail starting off the track). A race lasts
 *   4.33 stages on average (3 stages: 9.7 %, 4: 50.7 %, 5: 36.0 %, 6: 3.4 %).
 */
export const DEMO_MONEY_TABLES: MoneyTable[] = [
	// The first pick on the leader: 4 × 0.310 + 2 × 0.241 − 3 × 0.255 = +0.96 coins (a pick at random −0.50).
	table('mt-stage-1', 'Stage, first pick', [[1, 4], [2, 2], [3, 0]], -3),
	// The second pick on the leader: 3 × 0.310 + 1 × 0.241 − 3 × 0.255 = +0.41 coins (at random −0.83).
	// Every place spelt out, no catch-all: the validator must see all six covered.
	table('mt-stage-2', 'Stage, second pick', [[1, 3], [2, 1], [3, 0], [4, -3], [5, -3], [6, -3]]),
	// Winner and runner-up pay, any other place costs 2; with every chance at 1/6 the four picks
	// are worth (9 + 2 − 8) / 6 = +0.50, +0.17, −0.17 and −0.50 coins (the lab: within ±0.02 for every snail).
	table('mt-winner-1', 'Race winner, first pick', [[1, 9], [2, 2]], -2),
	table('mt-winner-2', 'Race winner, second pick', [[1, 7], [2, 2]], -2),
	table('mt-winner-3', 'Race winner, third pick', [[1, 6], [2, 1]], -2),
	table('mt-winner-4', 'Race winner, fourth pick', [[1, 4], [2, 1]], -2),
	// Mirrored for last place and the one before it: the lab gives the same four prices within ±0.02.
	table('mt-loser-1', 'Last place, first pick', [[6, 9], [5, 2]], -2),
	table('mt-loser-2', 'Last place, second pick', [[6, 7], [5, 2]], -2),
	table('mt-loser-3', 'Last place, third pick', [[6, 6], [5, 1]], -2),
	table('mt-loser-4', 'Last place, fourth pick', [[6, 4], [5, 1]], -2)
];

/* ------------------------------------------------------------ pricing positions */

/** The player count whose setup card the tables are priced on (the middle of 2..8). */
export const DEMO_PRICING_PLAYERS = 4;

export interface StagePosition {
	name: string;
	stacks: { space: number; bottomToTop: string[] }[];
	modifiers: { space: number; steps: number }[];
}

const at = (space: number, ...bottomToTop: string[]) => ({ space, bottomToTop });
const [rose, saff, sorr, pebb, bram, mari, beetle] = [...DEMO_RUNNERS.map((r) => r.id), DEMO_ROGUE.id];

/**
 * Where the snails stand at the start of a stage, on the 4-player track (22 spaces, finish 23),
 * as races of this game go: after one stage the snails are 2–4 spaces out and the beetle 2–3
 * back from the last space; by the fourth they are in the teens. The first has no leader (every
 * snail waits at the gate) and prices nothing; the demo ships all six as saved scenarios.
 */
export const DEMO_STAGE_POSITIONS: StagePosition[] = [
	{ name: 'Stage 1: everyone at the gate', stacks: [at(0, rose, saff, sorr, pebb, bram, mari), at(22, beetle)], modifiers: [] },
	{ name: 'Stage 2: a tall stack', stacks: [at(2, mari, sorr), at(3, bram), at(4, pebb, rose, saff), at(20, beetle)], modifiers: [] },
	{ name: 'Stage 3: the pack bunched', stacks: [at(6, pebb, bram), at(7, saff, mari), at(8, rose, sorr), at(18, beetle)], modifiers: [] },
	{
		name: 'Stage 3: strung out, a thistle ahead',
		stacks: [at(5, pebb), at(6, mari), at(8, saff), at(9, rose, bram), at(11, sorr), at(17, beetle)],
		modifiers: [{ space: 13, steps: -2 }]
	},
	{
		name: 'Stage 4: the beetle among the leaders',
		stacks: [at(10, sorr), at(12, bram), at(13, rose), at(14, beetle, mari), at(15, saff, pebb)],
		modifiers: [{ space: 17, steps: 2 }]
	},
	{ name: 'Stage 5: the final stretch', stacks: [at(9, beetle), at(15, bram), at(16, sorr, pebb), at(17, mari), at(19, rose, saff)], modifiers: [] }
];

/* ---------------------------------------------------------------- card kinds */

const poker = cardSize('poker');
const paper = '#f7f3e8';
const ink = '#2b2620';
const backArt = { mode: 'shared', template: 'back', params: {}, artSlot: 'backArt' } as const;

export const DEMO_KINDS: CardKind[] = [
	{
		id: 'kd-movement',
		name: 'Movement cards',
		type: 'movement',
		size: poker,
		bleed: 'metric',
		template: 'movement',
		params: { backgroundHex: paper, inkHex: ink, frameMm: 1.2, cornerRadiusMm: 3, titlePt: 14, bodyPt: 9, show: { art: true } },
		back: backArt,
		fields: [],
		artSlots: ['portrait', 'backArt']
	},
	{
		// Shuffled into the movement deck, so it has the very same back.
		id: 'kd-rogue',
		name: 'Beetle cards',
		type: 'rogue',
		size: poker,
		bleed: 'metric',
		template: 'rogue',
		params: { backgroundHex: '#efe7da', inkHex: ink, accentHex: '#23706b', frameMm: 1.2, cornerRadiusMm: 3, titlePt: 14, bodyPt: 9 },
		back: backArt,
		fields: [],
		artSlots: ['portrait', 'backArt']
	},
	{
		id: 'kd-wager',
		name: 'Wager cards',
		type: 'wager',
		size: cardSize('bridge'),
		bleed: 'metric',
		template: 'wager',
		params: { backgroundHex: paper, inkHex: ink, accentHex: '#d9a441', frameMm: 1, cornerRadiusMm: 3, titlePt: 12, bodyPt: 8, show: { art: true, tier: true } },
		back: backArt,
		fields: [],
		artSlots: ['portrait', 'backArt']
	},
	{
		id: 'kd-setup',
		name: 'Setup cards',
		type: 'setup',
		size: poker,
		bleed: 'metric',
		template: 'setup',
		params: {
			backgroundHex: paper,
			inkHex: ink,
			frameMm: 1,
			cornerRadiusMm: 3,
			titlePt: 16,
			bodyPt: 9,
			// The deal in the order it is made, in the demo's own words.
			rows: [
				{ field: 'handSize', label: 'Cards in each hand' },
				{ field: 'discards', label: 'Put aside unseen' },
				{ field: 'toSharedDeck', label: 'Dealt to the shared deck' },
				{ field: 'faceUp', label: 'Laid face up for all' },
				{ field: 'extraFromDeck', label: 'Added to the shared deck' },
				{ field: 'rogueToDeck', label: 'Beetle cards shuffled in' },
				{ field: 'trackLength', label: 'Track tiles to lay' }
			]
		},
		back: backArt,
		fields: [],
		artSlots: ['backArt']
	},
	{
		id: 'kd-hazard',
		name: 'Garden hazards',
		type: 'modifier',
		size: cardSize('mini'),
		bleed: 'metric',
		template: 'modifier',
		params: { backgroundHex: paper, inkHex: ink, frameMm: 1, cornerRadiusMm: 2.5, titlePt: 11, bodyPt: 7.5 },
		back: backArt,
		fields: [],
		artSlots: ['icon', 'backArt']
	},
	{
		id: 'kd-aid',
		name: 'Player aid',
		type: 'custom',
		size: poker,
		bleed: 'metric',
		template: 'custom',
		// The aid's text needs the whole face: no picture on the front.
		params: { backgroundHex: paper, inkHex: ink, frameMm: 1, cornerRadiusMm: 3, titlePt: 13, bodyPt: 8.5, show: { art: false, labels: false } },
		back: backArt,
		fields: ['title', 'body'],
		artSlots: ['backArt']
	},
	{
		id: 'kd-tile',
		name: 'Track tiles',
		type: 'tile',
		size: cardSize('tarot', true),
		bleed: 'metric',
		template: 'tile-front',
		params: { backgroundHex: '#cdb083', frameMm: 0, cornerRadiusMm: 0 },
		// Double-sided: each tile's back shows its own reverse side.
		back: { mode: 'per-card', template: 'tile-back', params: { backgroundHex: '#bb9868' } },
		fields: [],
		artSlots: ['ground']
	}
];

const kind = (id: string) => DEMO_KINDS.find((k) => k.id === id)!;

/* -------------------------------------------------------------- setup and track */

/**
 * Deal per player count. The snails' deck is 6 × 7 = 42 cards; the beetle's 3 cards stay apart
 * and `rogueToDeck` of them join each shared deck. A stage moves the shared deck (dealt + added)
 * plus the face-up cards: 12 cards at every player count, so the lab can price any start of a
 * stage exactly. Each turn turns one shared card, so a stage is 10 turns (9 for 7 players).
 * More players hold fewer cards each (less to deduce from) and meet the beetle more often.
 *
 * Track tiles from the lab's whole races (20,000 per count, seed 11): a race should last 3½ to
 * 6 stages and give every player at least 7 turns. 2 players, 5 tiles (18 spaces): 3.55 stages,
 * 17.7 turns each; 3–4 players, 6 tiles (22 spaces): 4.33 stages, 14.4 and 10.8 turns; 5–6
 * players, 6 tiles: 4.74 stages (two beetle cards a stage, fewer snail cards), 9.5 and 7.9 turns;
 * 7–8 players, 7 tiles (26 spaces): 5.63 stages, 7.2 and 7.0 turns.
 */
const DEALS: Omit<SetupData, 'type'>[] = [
	{ players: 2, handSize: 7, discards: 5, toSharedDeck: 8, faceUp: 2, extraFromDeck: 1, trackLength: 5, rogueToDeck: 1 },
	{ players: 3, handSize: 5, discards: 6, toSharedDeck: 8, faceUp: 2, extraFromDeck: 1, trackLength: 6, rogueToDeck: 1 },
	{ players: 4, handSize: 4, discards: 6, toSharedDeck: 8, faceUp: 2, extraFromDeck: 1, trackLength: 6, rogueToDeck: 1 },
	{ players: 5, handSize: 4, discards: 2, toSharedDeck: 7, faceUp: 2, extraFromDeck: 1, trackLength: 6, rogueToDeck: 2 },
	{ players: 6, handSize: 3, discards: 4, toSharedDeck: 7, faceUp: 2, extraFromDeck: 1, trackLength: 6, rogueToDeck: 2 },
	{ players: 7, handSize: 3, discards: 2, toSharedDeck: 6, faceUp: 3, extraFromDeck: 1, trackLength: 7, rogueToDeck: 2 },
	{ players: 8, handSize: 3, discards: 1, toSharedDeck: 6, faceUp: 2, extraFromDeck: 2, trackLength: 7, rogueToDeck: 2 }
];

/**
 * Eight double-sided tiles: a 3-space start (the garden gate), six 4-space tiles whose reverse
 * is a 3-space root-tangled side, and a 3-space finish (the flowerpot rim).
 */
const TILES = { count: 8, spacesFront: 4, spacesBack: 3, endSpaces: 3 } as const;

/**
 * Hazard tokens: no ±1. Two push a group on (+2, +3: it lands on top), two send it back (−2, −3:
 * it slips under). Each acts once and is lifted. Eight tokens, one per player at most.
 */
const HAZARDS: { id: string; name: string; steps: number; copies: number; effectText: string }[] = [
	{ id: 'hz-dew', name: 'Dew Trail', steps: 2, copies: 3, effectText: 'The snails that stop here glide two spaces on, onto the top of any stack. Then lift the token.' },
	{ id: 'hz-leaf', name: 'Fallen Leaf', steps: 3, copies: 1, effectText: 'A downhill ride: the snails that stop here slide three spaces on, onto the top. Then lift the token.' },
	{ id: 'hz-thistle', name: 'Thistle Patch', steps: -2, copies: 3, effectText: 'The snails that stop here back off two spaces and creep under any stack there. Then lift the token.' },
	{ id: 'hz-bootprint', name: 'Boot Print', steps: -3, copies: 1, effectText: 'The snails that stop here slither three spaces back, under any stack there. Then lift the token.' }
];

const AIDS: { id: string; title: string; body: string }[] = [
	{
		id: 'aid-turn',
		title: 'On your turn',
		body:
			'First turn the top card of the shared deck and move that snail with every snail riding on it; ' +
			'the beetle crawls back, 2 further when it carries snails. Then do one thing: take the top wager ' +
			'card of any snail, play a face-up card, or lay your hazard on an empty space. The cards in your hand ' +
			'sit out this stage: they tell you what the shared deck does not hold.'
	},
	{
		id: 'aid-scoring',
		title: 'When a stage ends',
		body:
			'The stage ends when the shared deck is empty; play any face-up cards left. Stage wagers pay what ' +
			'their table shows for the snail’s place: a snail on top of a stack is ahead of those under it. ' +
			'Race wagers wait until a snail crawls past the flowerpot rim. Then gather every card, deal again ' +
			'by the setup card and lay your hazard afresh.'
	}
];

function withCopies(cards: Card[], copiesBySteps: Readonly<Record<number, number>>): Card[] {
	return cards.map((c) => ({ ...c, copies: 'steps' in c.data ? (copiesBySteps[c.data.steps] ?? 0) : c.copies }));
}

function demoCards(): Card[] {
	const steps = (counts: Readonly<Record<number, number>>) => Object.keys(counts).map(Number);
	const movement = withCopies(
		generateMovementCards({ kind: kind('kd-movement'), runners: DEMO_RUNNERS, steps: steps(DEMO_SNAIL_CARDS), copies: 1 }),
		DEMO_SNAIL_CARDS
	);
	const rogue = withCopies(
		generateRogueCards({ kind: kind('kd-rogue'), rogue: DEMO_ROGUE, steps: steps(DEMO_BEETLE_CARDS), copies: 1 }),
		DEMO_BEETLE_CARDS
	);
	const wagers = generateWagerCards({
		kind: kind('kd-wager'),
		runners: DEMO_RUNNERS,
		tiers: {
			stage: ['mt-stage-1', 'mt-stage-2'],
			winner: ['mt-winner-1', 'mt-winner-2', 'mt-winner-3', 'mt-winner-4'],
			loser: ['mt-loser-1', 'mt-loser-2', 'mt-loser-3', 'mt-loser-4']
		},
		moneyTables: DEMO_MONEY_TABLES,
		copies: 1
	});
	const setups: Card[] = DEALS.map((deal) => ({
		id: `kd-setup.p${deal.players}`,
		kindId: 'kd-setup',
		name: `Setup for ${deal.players} players`,
		data: { type: 'setup', ...deal },
		copies: 1
	}));
	const hazards: Card[] = HAZARDS.map((h) => ({
		id: `kd-hazard.${h.id}`,
		kindId: 'kd-hazard',
		name: h.name,
		data: { type: 'modifier', name: h.name, effectText: h.effectText, steps: h.steps },
		copies: h.copies
	}));
	const aids: Card[] = AIDS.map((a) => ({
		id: `kd-aid.${a.id}`,
		kindId: 'kd-aid',
		name: a.title,
		data: { type: 'custom', values: { title: a.title, body: a.body } },
		copies: 8
	}));
	const tiles = generateTiles({
		kind: kind('kd-tile'),
		...TILES,
		backLabel: 'Root-tangled side',
		startLabel: 'Garden gate',
		finishLabel: 'Flowerpot rim'
	});
	return [...movement, ...rogue, ...wagers, ...setups, ...hazards, ...aids, ...tiles];
}

/** The whole demo game without art (fresh objects on every call). */
export function demoGame(): Game {
	return structuredClone({
		formatVersion: GAME_FORMAT_VERSION,
		name: 'The Marrowbed Derby',
		slug: 'marrowbed-derby',
		bleedStandard: 'metric',
		defaultSize: poker,
		runners: DEMO_RUNNERS,
		rogueRunner: DEMO_ROGUE,
		moneyTables: DEMO_MONEY_TABLES,
		kinds: DEMO_KINDS,
		cards: demoCards(),
		art: [],
		raceRules: { ...DEMO_RACE_RULES }
	} satisfies Game);
}
