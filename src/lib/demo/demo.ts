/**
 * The demo game: “The Marrowbed Derby”, a garden-snail race of our own invention.
 *
 * Every name, colour, payout and rule text here is made up for the demo. It exercises each part
 * of the model: six runners and a backwards-crawling beetle, money tables for three bet types in
 * three tiers, a movement matrix, double-sided track tiles with a narrowed reverse side, a setup
 * card for 2 to 8 players whose deal fits the deck, hazard tokens, a player aid and card backs.
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
	type SetupData
} from '../game/model';

export const DEMO_RUNNERS: Runner[] = [
	{ id: 'rn-rosehip', name: 'Rosehip', colourHex: '#c8363d', cmyk: { c: 0, m: 85, y: 75, k: 15 }, symbol: 'dot', sortOrder: 1 },
	{ id: 'rn-saffron', name: 'Saffron', colourHex: '#e9b824', cmyk: { c: 0, m: 22, y: 90, k: 5 }, symbol: 'triangle', sortOrder: 2 },
	{ id: 'rn-sorrel', name: 'Sorrel', colourHex: '#4c9a3b', cmyk: { c: 60, m: 0, y: 85, k: 20 }, symbol: 'square', sortOrder: 3 },
	{ id: 'rn-pebble', name: 'Pebble', colourHex: '#4a78b8', cmyk: { c: 75, m: 40, y: 0, k: 10 }, symbol: 'diamond', sortOrder: 4 },
	{ id: 'rn-bramble', name: 'Bramble', colourHex: '#7d4a9e', cmyk: { c: 55, m: 80, y: 0, k: 5 }, symbol: 'star', sortOrder: 5 },
	{ id: 'rn-marigold', name: 'Marigold', colourHex: '#e8782a', cmyk: { c: 0, m: 60, y: 90, k: 0 }, symbol: 'ring', sortOrder: 6 }
];

/** A ground beetle that crawls the wrong way and carries any snail riding on it. */
export const DEMO_ROGUE: RogueRunner = {
	id: 'rn-burrowback',
	name: 'Burrowback',
	colourHex: '#2e2a26',
	cmyk: { c: 60, m: 60, y: 65, k: 75 },
	symbol: 'cross'
};

const other = -1;
const table = (id: string, name: string, rows: [number, number][], otherCoins?: number): MoneyTable => ({
	id,
	name,
	rows: rows.map(([place, coins]) => ({ place, coins })),
	...(otherCoins === undefined ? {} : { otherCoins })
});

/** Invented payouts: earlier picks pay more, a wrong pick costs a coin. */
export const DEMO_MONEY_TABLES: MoneyTable[] = [
	table('mt-stage-1', 'Stage, first pick', [[1, 5], [2, 1]], other),
	table('mt-stage-2', 'Stage, second pick', [[1, 3], [2, 1]], other),
	// Every place spelt out, no catch-all: the validator must see all six covered.
	table('mt-stage-3', 'Stage, third pick', [[1, 2], [2, 1], [3, 0], [4, -1], [5, -1], [6, -1]]),
	table('mt-winner-1', 'Race winner, early', [[1, 7]], other),
	table('mt-winner-2', 'Race winner, middle', [[1, 5]], other),
	table('mt-winner-3', 'Race winner, late', [[1, 3]], other),
	table('mt-loser-1', 'Last place, early', [[6, 7]], other),
	table('mt-loser-2', 'Last place, middle', [[6, 5]], other),
	table('mt-loser-3', 'Last place, late', [[6, 3]], other)
];

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
		params: { backgroundHex: '#efe7da', inkHex: ink, accentHex: '#2e2a26', frameMm: 1.2, cornerRadiusMm: 3, titlePt: 14, bodyPt: 9 },
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
		params: { backgroundHex: paper, inkHex: ink, frameMm: 1, cornerRadiusMm: 3, titlePt: 16, bodyPt: 9 },
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

/**
 * Deal per player count, from a deck of 36 snail cards + 4 beetle cards = 40:
 * players × hand + discards + to shared deck + face up + extra ≤ 40, and the track ≤ 16 tiles.
 */
const DEALS: Omit<SetupData, 'type'>[] = [
	{ players: 2, handSize: 7, discards: 4, toSharedDeck: 10, faceUp: 2, extraFromDeck: 2, trackLength: 12 },
	{ players: 3, handSize: 6, discards: 3, toSharedDeck: 9, faceUp: 2, extraFromDeck: 2, trackLength: 12 },
	{ players: 4, handSize: 5, discards: 3, toSharedDeck: 8, faceUp: 2, extraFromDeck: 2, trackLength: 14 },
	{ players: 5, handSize: 4, discards: 3, toSharedDeck: 8, faceUp: 2, extraFromDeck: 2, trackLength: 14 },
	{ players: 6, handSize: 4, discards: 2, toSharedDeck: 6, faceUp: 2, extraFromDeck: 1, trackLength: 16 },
	{ players: 7, handSize: 3, discards: 2, toSharedDeck: 8, faceUp: 2, extraFromDeck: 1, trackLength: 16 },
	{ players: 8, handSize: 3, discards: 2, toSharedDeck: 6, faceUp: 1, extraFromDeck: 1, trackLength: 16 }
];

const HAZARDS: { id: string; name: string; steps: number; effectText: string }[] = [
	{ id: 'hz-clover', name: 'Clover Cushion', steps: 1, effectText: 'A snail that stops here slides one space on.' },
	{ id: 'hz-rain', name: 'Rain Slick', steps: 2, effectText: 'Wet leaves: a snail that stops here slides two spaces on.' },
	{ id: 'hz-eggshell', name: 'Eggshell Grit', steps: -1, effectText: 'Rough going: a snail that stops here pulls back one space.' },
	{ id: 'hz-ash', name: 'Ash Strip', steps: -2, effectText: 'A snail that stops here shrinks back two spaces.' }
];

const AIDS: { id: string; title: string; body: string }[] = [
	{
		id: 'aid-turn',
		title: 'On your turn',
		body:
			'Do one thing: play a card from your hand to move that snail, take the top wager card of one snail, ' +
			'or place your hazard on an empty space. A snail that lands on another climbs on top and rides along.'
	},
	{
		id: 'aid-scoring',
		title: 'When a stage ends',
		body:
			'The stage ends when the shared deck is empty. Each stage wager pays the coins its table shows for ' +
			'that snail’s place. Winner and last-place wagers wait for the end of the race.'
	}
];

function demoCards(): Card[] {
	const movement = generateMovementCards({ kind: kind('kd-movement'), runners: DEMO_RUNNERS, steps: [1, 2, 3], copies: 2 });
	const rogue = generateRogueCards({ kind: kind('kd-rogue'), rogue: DEMO_ROGUE, steps: [1, 2], copies: 2 });
	const wagers = generateWagerCards({
		kind: kind('kd-wager'),
		runners: DEMO_RUNNERS,
		tiers: {
			stage: ['mt-stage-1', 'mt-stage-2', 'mt-stage-3'],
			winner: ['mt-winner-1', 'mt-winner-2', 'mt-winner-3'],
			loser: ['mt-loser-1', 'mt-loser-2', 'mt-loser-3']
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
		copies: 2
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
		count: 16,
		spacesFront: 3,
		spacesBack: 2,
		backLabel: 'Narrow ledge',
		endSpaces: 2,
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
		art: []
	} satisfies Game);
}
