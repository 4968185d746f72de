import { beforeAll, describe, expect, it } from 'vitest';
import { demoGameWithArt } from '../demo/demo-art';
import type { Game } from '../game/model';
import { faceScope, PrintCache, canonicalJson } from './cache';
import { loadFonts, type FontSet } from './fonts';
import { buildGamePdf, type GamePdfOptions } from './sheet-job';
import { loadGameImages } from './job';
import { layoutFace } from './layout/index';

let demo: { game: Game; art: Map<string, Uint8Array> };
let fonts: FontSet;
beforeAll(async () => {
	[demo, fonts] = await Promise.all([demoGameWithArt(), loadFonts()]);
});

const OPTIONS: GamePdfOptions = { paper: 'a4', layout: 'spaced', duplex: 'long', marks: true, sets: 1, colour: 'rgb', date: '2026-01-01' };

describe('PrintCache', () => {
	it('evicts the least recently used entries once over its byte budget', () => {
		const cache = new PrintCache(100);
		cache.store('svg', 'a', 'A', 40);
		cache.store('svg', 'b', 'B', 40);
		expect(cache.lookup('svg', 'a')).toBe('A'); // a is now the most recent
		cache.store('svg', 'c', 'C', 40); // 120 bytes: b, the least recent, goes
		expect(cache.lookup('svg', 'b')).toBeUndefined();
		expect(cache.lookup('svg', 'a')).toBe('A');
		expect(cache.lookup('svg', 'c')).toBe('C');
		const s = cache.stats();
		expect(s.bytes).toBe(80);
		expect(s.evictions).toBe(1);
		expect(s.svg).toMatchObject({ hits: 3, misses: 1, entries: 2 });
		// A smaller budget drops the least recently used first.
		cache.resize(50);
		expect(cache.lookup('svg', 'a')).toBeUndefined();
		expect(cache.lookup('svg', 'c')).toBe('C');
		// Larger than the whole budget: handed back, not kept.
		cache.store('png', 'huge', new Uint8Array(1), 1000);
		expect(cache.lookup('png', 'huge')).toBeUndefined();
	});

	it('keys are independent of object key order', () => {
		expect(canonicalJson({ b: 1, a: [1, { d: 2, c: 3 }] })).toBe(canonicalJson({ a: [1, { c: 3, d: 2 }], b: 1 }));
	});
});

describe('rebuilds re-render only what changed', () => {
	it('one card changed: exactly its face is laid out again; art is not decoded again', async () => {
		const cache = new PrintCache();
		const game = structuredClone(demo.game);
		const first = await buildGamePdf(game, demo.art, { ...OPTIONS, cache });
		const cold = cache.stats();
		// Every distinct face once: 101 fronts, one shared back for each of 6 kinds, 8 tile backs.
		expect(cold.layout.misses).toBe(101 + 6 + 8);
		expect(cold.pixels.misses).toBe(new Set(game.art.map((a) => a.sha256)).size);

		cache.resetStats();
		await buildGamePdf(game, demo.art, { ...OPTIONS, cache });
		expect(cache.stats().layout.misses).toBe(0);
		expect(cache.stats().pixels.misses).toBe(0);

		// A movement card now moves one more step: its front changes, its shared back does not.
		cache.resetStats();
		const card = game.cards.find((c) => c.data.type === 'movement')!;
		if (card.data.type === 'movement') card.data.steps += 1;
		const changed = await buildGamePdf(game, demo.art, { ...OPTIONS, cache });
		expect(cache.stats().layout.misses).toBe(1);
		expect(cache.stats().pixels.misses).toBe(0);
		expect(changed.pdf.length).toBeGreaterThan(0);
		expect(first.sheets).toBe(changed.sheets);

		// A track tile has its own back: both faces are laid out again.
		cache.resetStats();
		const tile = game.cards.find((c) => c.data.type === 'tile')!;
		if (tile.data.type === 'tile') tile.data.backLabel = 'Mossy ledge';
		await buildGamePdf(game, demo.art, { ...OPTIONS, cache });
		expect(cache.stats().layout.misses).toBe(2);

		// Saving a card without changing it (the version goes up) re-renders nothing.
		cache.resetStats();
		game.cards[5].version = (game.cards[5].version ?? 0) + 1;
		await buildGamePdf(game, demo.art, { ...OPTIONS, cache });
		expect(cache.stats().layout.misses).toBe(0);

		// The game's name is on every shared back: those six backs, nothing else.
		cache.resetStats();
		game.name = 'The Marrowbed Derby, second edition';
		await buildGamePdf(game, demo.art, { ...OPTIONS, cache });
		expect(cache.stats().layout.misses).toBe(6);
	});

	it('a money table changed: only the wager cards that print it', async () => {
		const cache = new PrintCache();
		const game = structuredClone(demo.game);
		await buildGamePdf(game, demo.art, { ...OPTIONS, cache });
		cache.resetStats();
		const table = game.moneyTables[0];
		table.rows[0].coins += 1;
		await buildGamePdf(game, demo.art, { ...OPTIONS, cache });
		const users = game.cards.filter((c) => c.data.type === 'wager' && c.data.moneyTableId === table.id).length;
		expect(users).toBeGreaterThan(0);
		expect(cache.stats().layout.misses).toBe(users);
	});
});

describe('faceScope', () => {
	it('holds everything a face is drawn from: the same face comes out of a game cut down to the scope', async () => {
		const { game, art } = demo;
		const { images } = await loadGameImages(game, art, new PrintCache());
		const faces: { kindId: string; cardId?: string; side: 'front' | 'back' }[] = [];
		for (const card of game.cards) for (const side of ['front', 'back'] as const) faces.push({ kindId: card.kindId, cardId: card.id, side });
		for (const kind of game.kinds) faces.push({ kindId: kind.id, side: 'back' });
		for (const f of faces) {
			const kind = game.kinds.find((k) => k.id === f.kindId)!;
			const card = game.cards.find((c) => c.id === f.cardId);
			const scope = faceScope(game, kind, card, f.side);
			// Everything outside the scope replaced by something else.
			const reduced: Game = {
				...game,
				name: scope.gameName ?? 'Another game',
				runners: game.runners.map((r) =>
					r.id === scope.runner?.id
						? r
						: { ...r, name: 'Someone else', colourHex: '#123456', cmyk: { c: 1, m: 2, y: 3, k: 4 }, symbol: scope.symbols ? r.symbol : 'bars' }
				),
				rogueRunner: scope.rogueRunner ? game.rogueRunner : game.rogueRunner && { ...game.rogueRunner, name: 'Nobody', colourHex: '#654321' },
				moneyTables: game.moneyTables.map((t) => (t.id === scope.moneyTable?.id ? t : { ...t, name: 'Other', rows: [{ place: 1, coins: 99 }] })),
				kinds: [kind],
				cards: card ? [card] : [],
				art: game.art.filter((a) => scope.art.some((s) => s.id === a.id))
			};
			const full = layoutFace({ game, kind, card, side: f.side, images, fonts });
			const cut = layoutFace({ game: reduced, kind, card, side: f.side, images, fonts });
			expect(canonicalJson(cut), `${f.cardId ?? f.kindId} ${f.side}`).toBe(canonicalJson(full));
		}
	});
});
