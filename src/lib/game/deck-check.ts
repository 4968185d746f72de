/**
 * Deck check: does each setup card's deal fit the movement deck, and do the tiles make the track?
 *
 * The movement deck is every movement and rogue card with its copies, shuffled together.
 * A deal takes, from that deck:
 *   players × handSize + discards + toSharedDeck + faceUp + extraFromDeck
 * and the shared deck of a stage holds toSharedDeck + extraFromDeck cards. Whatever is left
 * (the remainder) stays out of the stage. A negative remainder means the deal cannot be made.
 */
import { RUNNERS_MAX, RUNNERS_MIN, type Card, type CardKindType, type Game, type Id, type SetupData } from './model';

export type Severity = 'error' | 'warning' | 'info';

export interface DeckIssue {
	severity: Severity;
	message: string;
	/** The setup card the issue is about, when it is about one. */
	cardId?: Id;
	players?: number;
}

/** What the game has to deal from and build the track with, counted with copies. */
export interface DeckSupply {
	movementCards: number;
	rogueCards: number;
	/** movementCards + rogueCards. */
	deckCards: number;
	tiles: number;
	startTiles: number;
	finishTiles: number;
}

export interface DealCheck {
	cardId?: Id;
	cardName?: string;
	players: number;
	/** players × handSize. */
	handCards: number;
	/** Everything the deal takes from the deck. */
	neededCards: number;
	deckCards: number;
	/** deckCards − neededCards; negative when the deck is too small. */
	remainder: number;
	/** Cards in the shared deck when the stage starts. */
	sharedDeckCards: number;
	trackLength: number;
	tilesAvailable: number;
	ok: boolean;
	issues: DeckIssue[];
}

export interface KindTotal {
	kindId: Id;
	name: string;
	type: CardKindType;
	/** Different cards (designs). */
	designs: number;
	/** Printed cards, with copies. */
	cards: number;
}

export interface DeckCheck {
	supply: DeckSupply;
	deals: DealCheck[];
	kinds: KindTotal[];
	/** All printed cards of the game, with copies. */
	totalCards: number;
	/** Game-wide issues followed by every deal's issues. */
	issues: DeckIssue[];
	ok: boolean;
}

/** Printed cards, with copies. */
export function cardCount(cards: readonly Card[]): number {
	return cards.reduce((n, c) => n + c.copies, 0);
}

export function deckSupply(game: Game): DeckSupply {
	let movementCards = 0;
	let rogueCards = 0;
	let tiles = 0;
	let startTiles = 0;
	let finishTiles = 0;
	for (const card of game.cards) {
		const d = card.data;
		if (d.type === 'movement') movementCards += card.copies;
		else if (d.type === 'rogue') rogueCards += card.copies;
		else if (d.type === 'tile') {
			tiles += card.copies;
			if (d.role === 'start') startTiles += card.copies;
			if (d.role === 'finish') finishTiles += card.copies;
		}
	}
	return { movementCards, rogueCards, deckCards: movementCards + rogueCards, tiles, startTiles, finishTiles };
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** Checks one deal table against the supply. */
export function checkDeal(
	setup: SetupData,
	supply: DeckSupply,
	card?: { id: Id; name: string }
): DealCheck {
	const handCards = setup.players * setup.handSize;
	const neededCards = handCards + setup.discards + setup.toSharedDeck + setup.faceUp + setup.extraFromDeck;
	// Rogue cards added to the shared deck are kept apart: the deal then comes from movement cards only.
	const rogueToDeck = setup.rogueToDeck ?? 0;
	const deckCards = rogueToDeck > 0 ? supply.movementCards : supply.deckCards;
	const remainder = deckCards - neededCards;
	const sharedDeckCards = setup.toSharedDeck + setup.extraFromDeck + rogueToDeck;
	const issues: DeckIssue[] = [];
	const who = `${setup.players} players`;
	const add = (severity: Severity, message: string) =>
		issues.push({ severity, message: `${who}: ${message}`, cardId: card?.id, players: setup.players });

	if (remainder < 0) {
		const parts = [
			`${setup.players} × ${setup.handSize} in hand`,
			`${setup.discards} discarded`,
			`${setup.toSharedDeck} to the shared deck`,
			`${setup.faceUp} face up`,
			`${setup.extraFromDeck} extra from the deck`
		];
		add(
			'error',
			`the deal needs ${plural(neededCards, 'movement card')} (${parts.join(', ')}) but the deck has ` +
				`${deckCards}: ${-remainder} short`
		);
	}
	if (rogueToDeck > supply.rogueCards)
		add('error', `the shared deck takes ${plural(rogueToDeck, 'rogue card')} but the game has ${supply.rogueCards}`);
	if (sharedDeckCards === 0) add('error', 'the shared deck would be empty, so a stage would end before it starts');
	if (setup.handSize === 0) add('warning', 'players are dealt no cards');
	if (setup.trackLength > supply.tiles)
		add(
			'error',
			`the track is ${plural(setup.trackLength, 'tile')} long but the game has only ${plural(supply.tiles, 'tile')}`
		);
	if (remainder > 0) add('info', `${plural(remainder, 'card')} stay out of the stage`);

	return {
		cardId: card?.id,
		cardName: card?.name,
		players: setup.players,
		handCards,
		neededCards,
		deckCards,
		remainder,
		sharedDeckCards,
		trackLength: setup.trackLength,
		tilesAvailable: supply.tiles,
		ok: !issues.some((i) => i.severity === 'error'),
		issues
	};
}

/** Cards per kind, designs and printed copies, in the game's kind order. */
export function kindTotals(game: Game): KindTotal[] {
	return game.kinds.map((kind) => {
		const cards = game.cards.filter((c) => c.kindId === kind.id);
		return { kindId: kind.id, name: kind.name, type: kind.type, designs: cards.length, cards: cardCount(cards) };
	});
}

/** The whole check: every setup card's deal, the track tiles, and the totals. */
export function checkDeck(game: Game): DeckCheck {
	const supply = deckSupply(game);
	const issues: DeckIssue[] = [];
	const setups = game.cards.filter((c): c is Card & { data: SetupData } => c.data.type === 'setup');

	if (game.runners.length < RUNNERS_MIN || game.runners.length > RUNNERS_MAX)
		issues.push({
			severity: 'warning',
			message: `A race has ${RUNNERS_MIN} to ${RUNNERS_MAX} runners; this game has ${game.runners.length}`
		});
	if (setups.length === 0) issues.push({ severity: 'warning', message: 'The game has no setup card yet' });
	if (setups.length > 0 && supply.deckCards === 0)
		issues.push({ severity: 'error', message: 'The game has no movement cards to deal' });

	const byPlayers = new Map<number, string[]>();
	for (const s of setups) byPlayers.set(s.data.players, [...(byPlayers.get(s.data.players) ?? []), s.name]);
	for (const [players, names] of byPlayers)
		if (names.length > 1)
			issues.push({
				severity: 'error',
				players,
				message: `${players} players have ${names.length} setup cards (${names.join(', ')}); keep one`
			});
	if (byPlayers.size > 1) {
		const counts = [...byPlayers.keys()].sort((a, b) => a - b);
		const missing: number[] = [];
		for (let p = counts[0]; p <= counts[counts.length - 1]; p++) if (!byPlayers.has(p)) missing.push(p);
		if (missing.length > 0)
			issues.push({ severity: 'warning', message: `No setup card for ${missing.join(', ')} players` });
	}

	if (setups.length > 0 || supply.tiles > 0) {
		if (supply.startTiles === 0) issues.push({ severity: 'error', message: 'The track has no start tile' });
		if (supply.finishTiles === 0) issues.push({ severity: 'error', message: 'The track has no finish tile' });
	}

	// A runner with fewer movement cards than the others is slower by design only if meant.
	const perRunner = new Map(game.runners.map((r) => [r.id, 0]));
	for (const c of game.cards)
		if (c.data.type === 'movement' && perRunner.has(c.data.runnerId))
			perRunner.set(c.data.runnerId, (perRunner.get(c.data.runnerId) ?? 0) + c.copies);
	if (supply.movementCards > 0) {
		const counts = new Set(perRunner.values());
		if (counts.size > 1) {
			const list = game.runners.map((r) => `${r.name} ${perRunner.get(r.id)}`).join(', ');
			issues.push({ severity: 'warning', message: `Runners have different numbers of movement cards: ${list}` });
		}
	}

	const deals = setups
		.slice()
		.sort((a, b) => a.data.players - b.data.players)
		.map((s) => checkDeal(s.data, supply, { id: s.id, name: s.name }));
	for (const d of deals) issues.push(...d.issues);

	const kinds = kindTotals(game);
	return {
		supply,
		deals,
		kinds,
		totalCards: cardCount(game.cards),
		issues,
		ok: !issues.some((i) => i.severity === 'error')
	};
}
