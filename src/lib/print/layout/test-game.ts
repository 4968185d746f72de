/**
 * An invented game for the layout tests and previews (our own names and numbers): a garden
 * snail race, five runners, one wrong-way runner, a few money tables and one card of each kind.
 */
import { cardSize, type Card, type CardKind, type Game } from '../../game/model';

const cmyk = (c: number, m: number, y: number, k: number) => ({ c, m, y, k });

const kind = (k: Partial<CardKind> & Pick<CardKind, 'id' | 'name' | 'type' | 'template'>): CardKind => ({
	size: cardSize('poker'),
	bleed: 'us',
	params: {},
	back: { mode: 'shared', template: 'back', params: {} },
	fields: [],
	artSlots: [],
	...k
});

export function testGame(): Game {
	const kinds: CardKind[] = [
		kind({ id: 'k-move', name: 'Crawl cards', type: 'movement', template: 'movement' }),
		kind({ id: 'k-rogue', name: 'Backslide cards', type: 'rogue', template: 'rogue' }),
		kind({ id: 'k-wager', name: 'Wager cards', type: 'wager', template: 'wager' }),
		kind({ id: 'k-setup', name: 'Setup cards', type: 'setup', template: 'setup' }),
		kind({ id: 'k-mod', name: 'Garden hazards', type: 'modifier', template: 'modifier', artSlots: ['picture'] }),
		kind({
			id: 'k-aid',
			name: 'Player aids',
			type: 'custom',
			template: 'custom',
			fields: ['title', 'onYourTurn', 'endOfStage', 'tip']
		}),
		kind({
			id: 'k-tile',
			name: 'Track tiles',
			type: 'tile',
			template: 'tile-front',
			size: cardSize('poker', true),
			bleed: 'metric',
			back: { mode: 'per-card', template: 'tile-back', params: {} }
		})
	];
	const cards: Card[] = [
		{ id: 'mv-bramble-2', kindId: 'k-move', name: 'Bramble 2', copies: 2, data: { type: 'movement', runnerId: 'r-bramble', steps: 2 } },
		{ id: 'mv-saffron-3', kindId: 'k-move', name: 'Saffron 3', copies: 2, data: { type: 'movement', runnerId: 'r-saffron', steps: 3 } },
		{ id: 'mv-nimbus-1', kindId: 'k-move', name: 'Nimbus 1', copies: 2, data: { type: 'movement', runnerId: 'r-nimbus', steps: 1 } },
		{ id: 'mv-long', kindId: 'k-move', name: 'Periwinkle 2', copies: 1, data: { type: 'movement', runnerId: 'r-long', steps: 2 } },
		{ id: 'rg-2', kindId: 'k-rogue', name: 'Backslide 2', copies: 1, data: { type: 'rogue', steps: 2 } },
		{
			id: 'wg-stage-ember-1',
			kindId: 'k-wager',
			name: 'Ember stage 1',
			copies: 1,
			data: { type: 'wager', betType: 'stage', runnerId: 'r-ember', tier: 1, moneyTableId: 'mt-stage-1' }
		},
		{
			id: 'wg-win-saffron-2',
			kindId: 'k-wager',
			name: 'Saffron winner 2',
			copies: 1,
			data: { type: 'wager', betType: 'winner', runnerId: 'r-saffron', tier: 2, moneyTableId: 'mt-winner-2' }
		},
		{
			id: 'st-4',
			kindId: 'k-setup',
			name: 'Four players',
			copies: 1,
			data: { type: 'setup', players: 4, handSize: 5, discards: 2, toSharedDeck: 1, faceUp: 3, extraFromDeck: 4, trackLength: 8 }
		},
		{
			id: 'md-puddle',
			kindId: 'k-mod',
			name: 'Puddle',
			copies: 2,
			data: { type: 'modifier', name: 'Puddle', effectText: 'A runner that stops here slips three spaces back, under whoever waits there.', steps: -3 }
		},
		{
			id: 'md-leaf',
			kindId: 'k-mod',
			name: 'Leaf ramp',
			copies: 2,
			data: { type: 'modifier', name: 'Leaf ramp', effectText: 'Stops here? Glide on two spaces, then the ramp is lifted off the track.', steps: 2 }
		},
		{
			id: 'aid-1',
			kindId: 'k-aid',
			name: 'Turn summary',
			copies: 5,
			data: {
				type: 'custom',
				values: {
					title: 'Your turn',
					onYourTurn: 'Do one thing: play a crawl card from your hand, take a wager card, or place a garden hazard.',
					endOfStage: 'When the shared deck runs out, pay out every stage wager, then shuffle and deal again.',
					tip: 'Early wagers pay more.'
				}
			}
		},
		{ id: 'tl-1', kindId: 'k-tile', name: 'Tile 1', copies: 1, data: { type: 'tile', number: 1, role: 'start', spacesFront: 4, spacesBack: 3, backLabel: 'Muddy side' } },
		{ id: 'tl-5', kindId: 'k-tile', name: 'Tile 5', copies: 1, data: { type: 'tile', number: 5, role: 'normal', spacesFront: 5, spacesBack: 3, backLabel: 'Narrow side' } },
		{ id: 'tl-9', kindId: 'k-tile', name: 'Tile 9', copies: 1, data: { type: 'tile', number: 9, role: 'finish', spacesFront: 3, spacesBack: 2, backLabel: 'Narrow side' } }
	];
	return {
		formatVersion: 1,
		name: 'Dewdrop Derby',
		slug: 'dewdrop-derby',
		bleedStandard: 'us',
		defaultSize: cardSize('poker'),
		runners: [
			{ id: 'r-bramble', name: 'Bramble', colourHex: '#3a7d44', cmyk: cmyk(70, 10, 85, 20), symbol: 'dot', sortOrder: 1 },
			{ id: 'r-saffron', name: 'Saffron', colourHex: '#f2c230', cmyk: cmyk(0, 20, 90, 0), symbol: 'triangle', sortOrder: 2 },
			{ id: 'r-nimbus', name: 'Nimbus', colourHex: '#4a6fa5', cmyk: cmyk(75, 45, 0, 5), symbol: 'square', sortOrder: 3 },
			{ id: 'r-ember', name: 'Ember', colourHex: '#c8553d', cmyk: cmyk(10, 75, 80, 5), symbol: 'diamond', sortOrder: 4 },
			{
				id: 'r-long',
				name: 'Periwinkle the Unhurried of Lower Hedgebottom',
				colourHex: '#8e7dbe',
				cmyk: cmyk(45, 50, 0, 0),
				symbol: 'star',
				sortOrder: 5
			}
		],
		rogueRunner: { id: 'r-gravel', name: 'Gravel', colourHex: '#8a5a3c', cmyk: cmyk(20, 60, 75, 25), symbol: 'bars' },
		moneyTables: [
			{ id: 'mt-stage-1', name: 'Stage, first taker', rows: [{ place: 1, coins: 4 }, { place: 2, coins: 2 }, { place: 3, coins: 1 }], otherCoins: -3 },
			{
				id: 'mt-winner-2',
				name: 'Race winner, second taker',
				rows: [
					{ place: 1, coins: 6 },
					{ place: 2, coins: 3 },
					{ place: 3, coins: 1 },
					{ place: 4, coins: 0 },
					{ place: 5, coins: -2 }
				]
			}
		],
		kinds,
		cards,
		art: []
	};
}
