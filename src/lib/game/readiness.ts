/**
 * The readiness list: what a designer should look at before printing. Nothing here blocks a save
 * or a proof; each item names the object to fix so the page can link to it.
 *
 * - every ranked runner has movement cards, and wager cards for every bet type the game uses;
 * - every money table a wager card prints covers every finishing place;
 * - runners told apart: no shared symbol, no two colours too close (CIEDE2000 ΔE, also under
 *   simulated red-green and blue-yellow colour blindness, through culori);
 * - art about to print: still a sketch or placeholder, under 300 dpi, or cropped by more than a third.
 */
import { differenceCiede2000, filterDeficiencyDeuter, filterDeficiencyProt, filterDeficiencyTrit, parse, type Color } from 'culori';
import { BET_TYPES, validateMoneyTable, type Game, type Id } from './model';
import { MIN_PRINT_DPI, shownDpi } from './art-check';

export type ObjectCollection = 'runner' | 'moneyTable' | 'kind' | 'card' | 'art' | 'rogue';

/** The object a readiness item is about, for a link to its editor. */
export interface ObjectRef {
	collection: ObjectCollection;
	id: Id;
	/** A card's kind, so its editor can be found. */
	kindId?: Id;
}

export type ReadinessCode =
	| 'no-movement'
	| 'no-wager'
	| 'table-gap'
	| 'same-symbol'
	| 'close-colours'
	| 'unfinished-art'
	| 'low-dpi'
	| 'cropped-art';

export interface ReadinessItem {
	code: ReadinessCode;
	message: string;
	ref?: ObjectRef;
}

/**
 * Two colours closer than this (CIEDE2000) are hard to tell apart at card size. Around 2 is a
 * just-noticeable difference side by side; 10 leaves room for small swatches, print drift and
 * poor light (our own threshold, not a standard).
 */
export const MIN_COLOUR_DELTA_E = 10;

/** More of the image than this cut away by 'cover' fitting is worth a look. */
export const MAX_CROP_FRACTION = 1 / 3;

const deltaE = differenceCiede2000();

const VISION: { name: string; filter: (c: Color) => Color }[] = [
	{ name: 'normal vision', filter: (c) => c },
	{ name: 'red-green colour blindness (deuteranopia)', filter: filterDeficiencyDeuter(1) },
	{ name: 'red-green colour blindness (protanopia)', filter: filterDeficiencyProt(1) },
	{ name: 'blue-yellow colour blindness (tritanopia)', filter: filterDeficiencyTrit(1) }
];

/** The smallest ΔE of two screen colours across normal and simulated colour-blind vision, and where. */
export function closestVision(aHex: string, bHex: string): { deltaE: number; vision: string } {
	const a = parse(aHex);
	const b = parse(bHex);
	if (!a || !b) return { deltaE: Infinity, vision: 'normal vision' };
	let best = { deltaE: Infinity, vision: 'normal vision' };
	for (const v of VISION) {
		const d = deltaE(v.filter(a), v.filter(b));
		if (d < best.deltaE) best = { deltaE: d, vision: v.name };
	}
	return best;
}

const BET_WORDS: Record<(typeof BET_TYPES)[number], string> = {
	stage: 'stage bets',
	winner: 'race-winner bets',
	loser: 'last-place bets'
};

function runnerChecks(game: Game): ReadinessItem[] {
	const items: ReadinessItem[] = [];
	const hasMovementKind = game.kinds.some((k) => k.type === 'movement');
	const betsInUse = new Set(game.cards.flatMap((c) => (c.data.type === 'wager' && c.copies > 0 ? [c.data.betType] : [])));
	for (const r of game.runners) {
		const ref: ObjectRef = { collection: 'runner', id: r.id };
		const cards = game.cards.filter((c) => c.copies > 0 && 'runnerId' in c.data && c.data.runnerId === r.id);
		if (hasMovementKind && !cards.some((c) => c.data.type === 'movement'))
			items.push({ code: 'no-movement', message: `${r.name} has no movement cards, so it can never move`, ref });
		for (const bet of BET_TYPES) {
			if (!betsInUse.has(bet)) continue;
			if (!cards.some((c) => c.data.type === 'wager' && c.data.betType === bet))
				items.push({ code: 'no-wager', message: `${r.name} has no wager cards for ${BET_WORDS[bet]}, which the other runners have`, ref });
		}
	}
	return items;
}

function tableChecks(game: Game): ReadinessItem[] {
	const printed = new Set(game.cards.flatMap((c) => (c.data.type === 'wager' && c.copies > 0 ? [c.data.moneyTableId] : [])));
	const items: ReadinessItem[] = [];
	for (const table of game.moneyTables) {
		if (!printed.has(table.id)) continue;
		for (const p of validateMoneyTable(table, game.runners.length).problems)
			if (p.severity === 'error') items.push({ code: 'table-gap', message: p.message, ref: { collection: 'moneyTable', id: table.id } });
	}
	return items;
}

function tellApartChecks(game: Game): ReadinessItem[] {
	const items: ReadinessItem[] = [];
	const all = [
		...game.runners.map((r) => ({ ...r, ref: { collection: 'runner', id: r.id } as ObjectRef })),
		...(game.rogueRunner ? [{ ...game.rogueRunner, ref: { collection: 'rogue', id: game.rogueRunner.id } as ObjectRef }] : [])
	];
	for (let i = 0; i < all.length; i++)
		for (let j = i + 1; j < all.length; j++) {
			const [a, b] = [all[i], all[j]];
			if (a.symbol === b.symbol)
				items.push({ code: 'same-symbol', message: `${a.name} and ${b.name} share the symbol “${a.symbol}”: give each its own`, ref: b.ref });
			const close = closestVision(a.colourHex, b.colourHex);
			if (close.deltaE < MIN_COLOUR_DELTA_E)
				items.push({
					code: 'close-colours',
					message: `${a.name} and ${b.name} look alike under ${close.vision} (ΔE ${close.deltaE.toFixed(1)}, under ${MIN_COLOUR_DELTA_E})`,
					ref: b.ref
				});
		}
	return items;
}

/** How an art piece prints where it prints softest (measured by laying out its faces; see $lib/art/placement). */
export interface ArtSlotCheck {
	dpi: number;
	ok: boolean;
	/** Image aspect ÷ slot aspect. */
	aspectRatio: number;
}

function artChecks(game: Game, printed: Map<Id, ArtSlotCheck | undefined>): ReadinessItem[] {
	const items: ReadinessItem[] = [];
	for (const art of game.art) {
		if (!art.assignment || !printed.has(art.id)) continue;
		const check = printed.get(art.id);
		const ref: ObjectRef = { collection: 'art', id: art.id };
		if (art.status !== 'final')
			items.push({ code: 'unfinished-art', message: `“${art.fileName}” is marked ${art.status} and is about to be printed`, ref });
		if (art.mime === 'image/svg+xml' || !check) continue;
		if (!check.ok)
			items.push({ code: 'low-dpi', message: `“${art.fileName}” prints at ${shownDpi(check.dpi)} dpi, under ${MIN_PRINT_DPI}`, ref });
		const kept = Math.min(check.aspectRatio, 1 / check.aspectRatio);
		if (1 - kept > MAX_CROP_FRACTION)
			items.push({ code: 'cropped-art', message: `“${art.fileName}” loses ${Math.round((1 - kept) * 100)}% of the image to cropping`, ref });
	}
	return items;
}

/**
 * Every readiness item of the game, runners first, then tables, telling runners apart, and art.
 * `printed`: for each art piece that prints, its check where it prints softest (undefined when
 * only its status matters); art missing from the map prints nowhere and is not listed.
 */
export function readiness(game: Game, printed: Map<Id, ArtSlotCheck | undefined> = new Map()): ReadinessItem[] {
	const cardKind = new Map(game.cards.map((c) => [c.id, c.kindId]));
	return [...runnerChecks(game), ...tableChecks(game), ...tellApartChecks(game), ...artChecks(game, printed)].map((item) =>
		item.ref?.collection === 'card' ? { ...item, ref: { ...item.ref, kindId: cardKind.get(item.ref.id) } } : item
	);
}

/** Where a readiness item's object is edited, inside the game's pages. */
export function objectPath(gameId: Id, ref: ObjectRef): string {
	const base = `/games/${gameId}`;
	switch (ref.collection) {
		case 'runner':
			return `${base}/runners?runner=${ref.id}`;
		case 'rogue':
			return `${base}/runners#rogue`;
		case 'moneyTable':
			return `${base}/money-tables?table=${ref.id}`;
		case 'kind':
			return `${base}/kinds/${ref.id}`;
		case 'card':
			return `${base}/kinds/${ref.kindId}?card=${ref.id}`;
		case 'art':
			return `${base}/art?art=${ref.id}`;
	}
}

/** What refers to an object (cards, art), in words: empty when it can go without breaking anything. */
export function usersOf(game: Game, ref: ObjectRef): string[] {
	const kindName = new Map(game.kinds.map((k) => [k.id, k.name]));
	const byKind = new Map<string, number>();
	for (const c of game.cards) {
		const d = c.data;
		const uses =
			(ref.collection === 'runner' && 'runnerId' in d && d.runnerId === ref.id) ||
			(ref.collection === 'moneyTable' && d.type === 'wager' && d.moneyTableId === ref.id) ||
			(ref.collection === 'kind' && c.kindId === ref.id);
		if (uses) byKind.set(c.kindId, (byKind.get(c.kindId) ?? 0) + 1);
	}
	const words = [...byKind].map(([kindId, n]) => `${n} ${n === 1 ? 'card' : 'cards'} of “${kindName.get(kindId) ?? kindId}”`);
	const art = game.art.filter((a) => a.assignment && a.assignment.targetId === ref.id && a.assignment.scope === ref.collection);
	if (art.length) words.push(`art ${art.map((a) => `“${a.fileName}”`).join(', ')}`);
	return words;
}
