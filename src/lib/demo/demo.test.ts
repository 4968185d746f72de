import { imageSize } from 'image-size';
import { describe, expect, it } from 'vitest';
import { checkArtResolution } from '../game/art-check';
import { readBundle, writeBundle } from '../game/bundle';
import { checkDeck } from '../game/deck-check';
import { demoGame } from './demo';
import { demoGameWithArt, initResvg, renderDemoArt, renderSvgToPng } from './demo-art';
import { findReferenceProblems, GameSchema, RUNNERS_MAX, RUNNERS_MIN, validateMoneyTable } from '../game/model';

describe('demo game', () => {
	const game = demoGame();
	it('passes the game schema unchanged', () => {
		expect(GameSchema.parse(game)).toEqual(game);
		expect(findReferenceProblems(game)).toEqual([]);
	});
	it('has 3..8 runners with distinct colours and symbols', () => {
		expect(game.runners.length).toBeGreaterThanOrEqual(RUNNERS_MIN);
		expect(game.runners.length).toBeLessThanOrEqual(RUNNERS_MAX);
		expect(new Set(game.runners.map((r) => r.colourHex)).size).toBe(game.runners.length);
		expect(new Set(game.runners.map((r) => r.symbol)).size).toBe(game.runners.length);
		expect(game.rogueRunner).toBeDefined();
	});
	it('covers every place in every money table', () => {
		for (const t of game.moneyTables) expect(validateMoneyTable(t, game.runners.length)).toEqual({ ok: true, problems: [] });
	});
	it('deals for 2 to 8 players without an error or warning', () => {
		const check = checkDeck(game);
		expect(check.deals.map((d) => d.players)).toEqual([2, 3, 4, 5, 6, 7, 8]);
		expect(check.issues.filter((i) => i.severity !== 'info')).toEqual([]);
	});
	it('has a shared back for the decks and per-card backs for the tiles', () => {
		const tile = game.kinds.find((k) => k.type === 'tile')!;
		expect(tile.back.mode).toBe('per-card');
		expect(game.kinds.filter((k) => k.type !== 'tile').every((k) => k.back.mode === 'shared')).toBe(true);
		const tiles = game.cards.filter((c) => c.data.type === 'tile');
		expect(tiles.map((c) => (c.data.type === 'tile' ? c.data.role : ''))).toEqual(['start', ...Array(6).fill('normal'), 'finish']);
	});
	it('returns fresh objects on every call', () => {
		const a = demoGame();
		a.runners[0].name = 'Changed';
		expect(demoGame().runners[0].name).toBe('Rosehip');
	});
});

describe('demo art', () => {
	it('initialises resvg once, however often it is asked', async () => {
		// Every caller shares one initialisation: the same promise, settled without error.
		const first = initResvg();
		expect(initResvg()).toBe(first);
		await expect(Promise.all([first, initResvg()])).resolves.toEqual([undefined, undefined]);
		// And the engine draws afterwards: a 40 × 20 viewBox drawn 80 px wide is 80 × 40 px.
		const drawn = await renderSvgToPng('<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 40 20"><rect width="40" height="20"/></svg>', 80);
		expect([drawn.widthPx, drawn.heightPx]).toEqual([80, 40]);
		expect(imageSize(drawn.bytes)).toMatchObject({ type: 'png', width: 80, height: 40 });
	});

	it('renders PNGs whose size an independent reader confirms, mostly ≥ 300 dpi, two deliberately coarse', async () => {
		const art = await renderDemoArt();
		const coarse: string[] = [];
		for (const piece of art.values()) {
			// image-size reads the PNG IHDR chunk on its own (PNG spec, ISO/IEC 15948; section number from memory: 11.2.2).
			const size = imageSize(piece.bytes);
			expect(size.type).toBe('png');
			expect([size.width, size.height]).toEqual([piece.widthPx, piece.heightPx]);
			const check = checkArtResolution(piece, piece.slotMm);
			if (!check.ok) coarse.push(piece.key);
			expect(Math.abs(check.aspectRatio - 1)).toBeLessThan(0.01);
		}
		expect(coarse.sort()).toEqual(['back-dew', 'portrait-rn-pebble']);
		expect(art.size).toBeGreaterThan(10);
	});

	it('is the same image on every render (same bytes, same hash)', async () => {
		const [a, b] = [await renderDemoArt(), await renderDemoArt()];
		for (const [key, piece] of a) expect(b.get(key)!.sha256).toBe(piece.sha256);
	});

	it('goes through a bundle and back unchanged', async () => {
		const { game, art } = await demoGameWithArt();
		expect(findReferenceProblems(game)).toEqual([]);
		// Movement and beetle cards share one back image: one file, two assignments.
		const leaf = game.art.filter((a) => a.fileName === 'back-leaf.png');
		expect(leaf.map((a) => a.assignment?.targetId)).toEqual(['kd-movement', 'kd-rogue']);
		expect(new Set(leaf.map((a) => a.sha256)).size).toBe(1);
		const back = readBundle(writeBundle(game, art));
		expect(back.game).toEqual(game);
		expect(back.art).toEqual(art);
	});
});
