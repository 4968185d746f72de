import { beforeAll, describe, expect, it } from 'vitest';
import { safeMm, type Game } from '../../game/model';
import { faceHeightMm, faceWidthMm, type DisplayItem, type FaceLayout, type ImageItem, type TextItem } from '../display-list';
import { loadFonts, type FontSet } from '../fonts';
import { pathBounds } from '../symbols';
import { layoutFace, type LayoutFaceInput } from './index';
import { START_LINE_MM } from './tile';
import { testGame } from './test-game';

let fonts: FontSet;
beforeAll(async () => {
	fonts = await loadFonts();
});

const texts = (f: FaceLayout) => f.items.filter((i): i is TextItem => i.type === 'text');

function face(game: Game, cardId: string, side: 'front' | 'back' = 'front', extra: Partial<LayoutFaceInput> = {}) {
	const card = game.cards.find((c) => c.id === cardId)!;
	const kind = game.kinds.find((k) => k.id === card.kindId)!;
	return layoutFace({ game, kind, card, side, fonts, ...extra });
}

/** Ink box of a text item straight from fontkit's glyph outlines. */
function inkBox(t: TextItem) {
	const f = fonts[t.weight].metrics;
	const bb = f.layout(t.text).bbox;
	const k = (t.sizePt * 25.4) / 72 / f.unitsPerEm;
	return { x0: t.xMm + bb.minX * k, x1: t.xMm + bb.maxX * k, y0: t.yMm - bb.maxY * k, y1: t.yMm - bb.minY * k };
}

function itemBox(i: DisplayItem) {
	switch (i.type) {
		case 'rect':
		case 'image':
			return { x0: i.xMm, y0: i.yMm, x1: i.xMm + i.wMm, y1: i.yMm + i.hMm };
		case 'ellipse':
			return { x0: i.cxMm - i.rxMm, y0: i.cyMm - i.ryMm, x1: i.cxMm + i.rxMm, y1: i.cyMm + i.ryMm };
		case 'line':
			return { x0: Math.min(i.x1Mm, i.x2Mm), y0: Math.min(i.y1Mm, i.y2Mm), x1: Math.max(i.x1Mm, i.x2Mm), y1: Math.max(i.y1Mm, i.y2Mm) };
		case 'path':
			return pathBounds(i.d)!;
		case 'text':
			return inkBox(i);
	}
}

describe('layoutFace on every card of the test game', () => {
	it('lays out both faces without warnings, text inside the safe area, nothing outside the face', () => {
		const game = testGame();
		for (const card of game.cards)
			for (const side of ['front', 'back'] as const) {
				const f = face(game, card.id, side);
				const where = `${card.id} ${side}`;
				expect(f.warnings, where).toEqual([]);
				const kind = game.kinds.find((k) => k.id === card.kindId)!;
				expect([f.trimWidthMm, f.trimHeightMm], where).toEqual([kind.size.widthMm, kind.size.heightMm]);
				expect(f.safeMm).toBe(safeMm(kind.bleed));
				const s0 = f.bleedMm + f.safeMm;
				for (const t of texts(f)) {
					const b = inkBox(t);
					expect(b.x0, `${where} “${t.text}”`).toBeGreaterThanOrEqual(s0 - 1e-6);
					expect(b.y0, `${where} “${t.text}”`).toBeGreaterThanOrEqual(s0 - 1e-6);
					expect(b.x1, `${where} “${t.text}”`).toBeLessThanOrEqual(f.bleedMm + f.trimWidthMm - f.safeMm + 1e-6);
					expect(b.y1, `${where} “${t.text}”`).toBeLessThanOrEqual(f.bleedMm + f.trimHeightMm - f.safeMm + 1e-6);
				}
				// Imposition places faces side by side without clipping: nothing may reach past the bleed.
				for (const item of f.items) {
					const b = itemBox(item);
					expect(b.x0, `${where} ${item.type}`).toBeGreaterThanOrEqual(-1e-6);
					expect(b.y0, `${where} ${item.type}`).toBeGreaterThanOrEqual(-1e-6);
					expect(b.x1, `${where} ${item.type}`).toBeLessThanOrEqual(faceWidthMm(f) + 1e-6);
					expect(b.y1, `${where} ${item.type}`).toBeLessThanOrEqual(faceHeightMm(f) + 1e-6);
				}
			}
	});

	it('fills the bleed with the ground colour', () => {
		const f = face(testGame(), 'mv-bramble-2');
		expect(f.items[0]).toMatchObject({ type: 'rect', xMm: 0, yMm: 0, wMm: faceWidthMm(f), hMm: faceHeightMm(f) });
	});
});

describe('movement and rogue', () => {
	it('prints the runner’s name, the step count and draws the runner’s own symbol', () => {
		const game = testGame();
		const f = face(game, 'mv-saffron-3');
		const words = texts(f).map((t) => t.text);
		expect(words).toEqual(expect.arrayContaining(['Saffron', '3', 'Saffron 3']));
		const paths = (x: FaceLayout) => x.items.filter((i) => i.type === 'path').map((i) => (i as { d: string }).d);
		game.runners.find((r) => r.id === 'r-saffron')!.symbol = 'ring';
		const other = face(game, 'mv-saffron-3');
		expect(paths(other)).not.toEqual(paths(f));
	});

	it('shrinks and wraps a long runner name inside the band without a warning', () => {
		const f = face(testGame(), 'mv-long');
		expect(f.warnings).toEqual([]);
		const name = texts(f).filter((t) => t.weight === 'bold' && t.sizePt < 17 && t.text !== '2');
		expect(name.length).toBe(2);
		expect(name.map((t) => t.text).join(' ')).toBe('Periwinkle the Unhurried of Lower Hedgebottom');
	});

	it('warns when a name cannot fit even at the smallest size', () => {
		const game = testGame();
		game.runners.find((r) => r.id === 'r-long')!.name = 'Periwinkle the Unhurried, Undaunted and Unbothered of Lower Hedgebottom';
		const kind = game.kinds.find((k) => k.id === 'k-move')!;
		kind.params = { titleMinPt: 14 };
		const f = face(game, 'mv-long');
		expect(f.warnings.join('\n')).toMatch(/runner name ".*" does not fit .* at 14 pt/);
	});

	it('the rogue card’s arrow points backwards (its tip is its leftmost point)', () => {
		const game = testGame();
		const f = face(game, 'rg-2');
		expect(texts(f).map((t) => t.text)).toEqual(expect.arrayContaining(['Gravel', '2', 'moves back']));
		const arrow = f.items.find((i) => i.type === 'path' && i.fill?.hex === game.rogueRunner!.colourHex && i.stroke) as { d: string };
		const pts = [...arrow.d.matchAll(/(-?[\d.]+) (-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
		const b = pathBounds(arrow.d)!;
		const tip = pts.filter(([x]) => x === b.x0);
		expect(tip).toHaveLength(1);
		expect(tip[0][1]).toBeCloseTo((b.y0 + b.y1) / 2, 2);
	});
});

describe('setup, modifier, custom', () => {
	it('the setup card prints its whole deal table and the track length', () => {
		const game = testGame();
		const f = face(game, 'st-4');
		const words = texts(f).map((t) => t.text);
		expect(words).toContain('4 players');
		const d = game.cards.find((c) => c.id === 'st-4')!.data as Extract<Game['cards'][number]['data'], { type: 'setup' }>;
		for (const v of [d.handSize, d.discards, d.toSharedDeck, d.faceUp, d.extraFromDeck, d.trackLength]) expect(words).toContain(String(v));
		expect(words).toEqual(expect.arrayContaining(['Cards in each hand', 'Track tiles to lay']));
	});

	it('the modifier card prints its name, signed steps and effect', () => {
		const f = face(testGame(), 'md-puddle');
		const words = texts(f).map((t) => t.text);
		expect(words).toContain('Puddle');
		expect(words).toContain('\u22123');
		expect(words.join(' ')).toContain('slips three spaces back');
	});

	it('the custom card prints its title and every field with its label', () => {
		const f = face(testGame(), 'aid-1');
		const all = texts(f).map((t) => t.text).join(' ');
		for (const s of ['Your turn', 'On your turn', 'End of stage', 'Tip', 'Early wagers pay more.']) expect(all).toContain(s);
	});
});

describe('track tiles', () => {
	const cells = (f: FaceLayout, hex: string) => f.items.filter((i) => i.type === 'rect' && i.fill?.hex === hex && i.stroke).length;

	it('draws the front’s spaces as cells and the per-card back with its own count and label', () => {
		const game = testGame();
		const front = face(game, 'tl-5', 'front');
		const back = face(game, 'tl-5', 'back');
		expect(cells(front, '#f7f3ea')).toBe(5);
		expect(cells(back, '#eee8da')).toBe(3);
		expect(texts(front).map((t) => t.text)).toContain('5');
		expect(texts(back).map((t) => t.text)).toEqual(expect.arrayContaining(['5', 'Narrow side']));
		// Backs differ per tile.
		expect(texts(face(game, 'tl-1', 'back')).map((t) => t.text)).toEqual(expect.arrayContaining(['1', 'Muddy side']));
	});

	it('marks the start and the finish', () => {
		const game = testGame();
		expect(texts(face(game, 'tl-1')).map((t) => t.text)).toContain('Start');
		expect(texts(face(game, 'tl-9')).map((t) => t.text)).toContain('Finish');
	});

	it('draws the start line as one solid ink bar, with no light outline to read as a white sliver', () => {
		const game = testGame();
		const f = face(game, 'tl-1');
		const cell = f.items.find((i) => i.type === 'rect' && i.fill?.hex === '#f7f3ea' && i.stroke)!;
		if (cell.type !== 'rect') throw new Error('no cell');
		// The bar runs the full height of the cells, left of the first one.
		const bar = f.items.find((i) => i.type === 'rect' && i.xMm < cell.xMm && Math.abs(i.hMm - cell.hMm) < 1 && i.wMm < 5);
		expect(bar).toMatchObject({ type: 'rect', wMm: START_LINE_MM });
		expect(bar && 'stroke' in bar ? bar.stroke : undefined).toBeUndefined();
	});
});

describe('backs', () => {
	it('shares one back per kind, with the game’s name, drawn without a card', () => {
		const game = testGame();
		const kind = game.kinds.find((k) => k.id === 'k-move')!;
		const f = layoutFace({ game, kind, side: 'back', fonts });
		expect(f.warnings).toEqual([]);
		expect(texts(f).map((t) => t.text)).toEqual(expect.arrayContaining(['Dewdrop Derby', 'Crawl cards']));
		expect(f.items.some((i) => i.type === 'path')).toBe(true);
	});

	it('a per-card back without its card says so', () => {
		const game = testGame();
		const kind = game.kinds.find((k) => k.id === 'k-tile')!;
		const f = layoutFace({ game, kind, side: 'back', fonts });
		expect(f.warnings.join()).toMatch(/needs its card/);
	});
});

describe('layout parameters', () => {
	it('a kind’s params override the built-in layout; a bad value is refused with a warning', () => {
		const game = testGame();
		const kind = game.kinds.find((k) => k.id === 'k-move')!;
		kind.params = { backgroundHex: '#101820', titlePt: 'big' as unknown as number, show: { cardName: false } };
		const f = face(game, 'mv-bramble-2');
		expect(f.items[0]).toMatchObject({ type: 'rect', fill: { hex: '#101820' } });
		expect(texts(f).map((t) => t.text)).not.toContain('Bramble 2');
		expect(f.warnings.join()).toMatch(/titlePt should be a number/);
	});

	it('an unknown layout falls back to the default for the kind, with a warning', () => {
		const game = testGame();
		game.kinds.find((k) => k.id === 'k-move')!.template = 'no-such-layout';
		const f = face(game, 'mv-bramble-2');
		expect(f.warnings.join()).toMatch(/“no-such-layout” is not a built-in layout/);
		expect(texts(f).map((t) => t.text)).toContain('2');
	});
});

describe('art slots', () => {
	const withArt = (loaded: boolean) => {
		const game = testGame();
		const sha = 'b'.repeat(64);
		game.art.push({
			id: 'art-puddle',
			sha256: sha,
			mime: 'image/png',
			widthPx: 1200,
			heightPx: 400,
			status: 'final',
			fileName: 'puddle.png',
			assignment: { scope: 'card', targetId: 'md-puddle', slot: 'picture' }
		});
		const images = new Map(loaded ? [[sha, { id: sha, mime: 'image/png' as const, bytes: new Uint8Array(8), widthPx: 1200, heightPx: 400 }]] : []);
		return face(game, 'md-puddle', 'front', { images });
	};

	it('draws assigned art cover-fitted and clipped to the slot', () => {
		const f = withArt(true);
		expect(f.warnings).toEqual([]);
		const img = f.items.find((i): i is ImageItem => i.type === 'image')!;
		expect(img.imageId).toBe('b'.repeat(64));
		// Aspect kept (3:1), the slot filled: the image covers the clip box and is centred on it.
		expect(img.wMm / img.hMm).toBeCloseTo(3, 6);
		const c = img.clip!;
		expect(img.wMm).toBeGreaterThanOrEqual(c.wMm - 1e-9);
		expect(img.hMm).toBeGreaterThanOrEqual(c.hMm - 1e-9);
		expect(Math.min(img.wMm - c.wMm, img.hMm - c.hMm)).toBeCloseTo(0, 6);
		expect(img.xMm + img.wMm / 2).toBeCloseTo(c.xMm + c.wMm / 2, 6);
	});

	it('draws a placeholder when no art is assigned, and warns when assigned art is not loaded', () => {
		const none = face(testGame(), 'md-puddle');
		expect(none.items.some((i) => i.type === 'image')).toBe(false);
		expect(texts(none).map((t) => t.text)).toContain('art: picture');
		const missing = withArt(false);
		expect(missing.items.some((i) => i.type === 'image')).toBe(false);
		expect(missing.warnings.join()).toMatch(/puddle.png.*not loaded/);
	});
});

describe('art slot per face', () => {
	it('a front never shows the slot that belongs to the shared back', () => {
		const game = testGame();
		const kind = game.kinds.find((k) => k.id === 'k-aid')!;
		kind.artSlots = ['backArt'];
		kind.back = { mode: 'shared', template: 'back', params: {}, artSlot: 'backArt' };
		const f = face(game, 'aid-1');
		expect(texts(f).map((t) => t.text)).not.toContain('art: backArt');
		const back = face(game, 'aid-1', 'back');
		expect(texts(back).map((t) => t.text)).toContain('Dewdrop Derby');
	});

	it('a tile draws its ground art to the bleed edge', () => {
		const game = testGame();
		const kind = game.kinds.find((k) => k.id === 'k-tile')!;
		kind.artSlots = ['ground'];
		const sha = 'c'.repeat(64);
		game.art.push({ id: 'soil', sha256: sha, mime: 'image/png', widthPx: 1000, heightPx: 700, status: 'final', fileName: 'soil.png', assignment: { scope: 'kind', targetId: 'k-tile', slot: 'ground' } });
		const images = new Map([[sha, { id: sha, mime: 'image/png' as const, bytes: new Uint8Array(8), widthPx: 1000, heightPx: 700 }]]);
		const f = face(game, 'tl-5', 'front', { images });
		const img = f.items.find((i): i is ImageItem => i.type === 'image')!;
		expect(img.clip).toEqual({ xMm: 0, yMm: 0, wMm: faceWidthMm(f), hMm: faceHeightMm(f) });
		expect(f.warnings).toEqual([]);
	});
});

describe('back plaque', () => {
	it('grows to hold the game’s name on a small card instead of overflowing', () => {
		const game = testGame();
		game.name = 'The Long-Awaited Dewdrop Derby';
		const kind = { ...game.kinds.find((k) => k.id === 'k-mod')!, size: { preset: 'mini' as const, widthMm: 44, heightMm: 68 } };
		const f = layoutFace({ game, kind, side: 'back', fonts });
		expect(f.warnings).toEqual([]);
		expect(texts(f).map((t) => t.text).join(' ')).toContain('The Long-Awaited');
	});
});

