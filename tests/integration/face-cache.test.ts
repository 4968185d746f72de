/**
 * Card faces are kept by what they are drawn from and revalidated with ETags (RFC 9110 §8.8.3,
 * §13.1.2: If-None-Match answers 304 Not Modified with no body); a proof's faces never change,
 * so they are sent `immutable` (RFC 8246).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openWorld, fakeEvent, type World, actorIn } from './harness';
import { applyChanges, loadGame } from '$lib/server/game-store';
import { cutProof } from '$lib/server/proofs';
import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { faceCacheStats } from '$lib/server/face-cache';
import { renderFaceTemplate } from '$lib/server/faces';
import { readArtFile } from '$lib/server/art-files';
import { loadFonts } from '$lib/print/fonts';
import { layoutFace } from '$lib/print/layout';
import { renderSvg } from '$lib/print/svg';
import { artAssets } from '$lib/print/face-svg';
import * as cardFace from '../../src/routes/api/v1/games/[gameId=id]/cards/[cardId]/face.svg/+server';
import * as proofFace from '../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/cards/[cardId]/face.svg/+server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const ev = (call: Parameters<typeof fakeEvent>[1]) => fakeEvent(w.callers.designer, call) as any;

describe('working faces', () => {
	it('carry an ETag; the same ETag back gives 304; a change to what the face prints gives a new one', async () => {
		const game = await loadGame(w.db, w.gameId);
		const card = game.cards.find((c) => c.data.type === 'movement')!;
		const other = game.cards.find((c) => c.data.type === 'movement' && c.id !== card.id && c.kindId === card.kindId)!;
		const params = { gameId: w.gameId, cardId: card.id };
		const first = await cardFace.GET(ev({ params }));
		expect(first.status).toBe(200);
		const etag = first.headers.get('etag')!;
		expect(etag).toMatch(/^"[0-9a-f]{32}"$/);
		expect(first.headers.get('cache-control')).toContain('no-cache');
		const svg = await first.text();
		expect(svg).toContain('<svg');

		const again = await cardFace.GET(ev({ params, headers: { 'if-none-match': etag } }));
		expect(again.status).toBe(304);
		expect(await again.text()).toBe('');
		// Without the ETag: the same bytes, from the cache.
		const plain = await cardFace.GET(ev({ params }));
		expect(await plain.text()).toBe(svg);
		// Other guides are another drawing.
		const guided = await cardFace.GET(ev({ params, path: '/?guides=all', headers: { 'if-none-match': etag } }));
		expect(guided.status).toBe(200);

		// Saving another card bumps the game's version but leaves this face as it was: still 304.
		await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'card', id: other.id, baseVersion: other.version, object: { ...other, version: undefined, name: `${other.name} (renamed)` } }], action: 'test' });
		expect((await cardFace.GET(ev({ params, headers: { 'if-none-match': etag } }))).status).toBe(304);

		// Renaming this card changes what it prints: a new ETag and a new face.
		await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'card', id: card.id, baseVersion: card.version, object: { ...card, version: undefined, name: 'Renamed runner card' } }], action: 'test' });
		const changed = await cardFace.GET(ev({ params, headers: { 'if-none-match': etag } }));
		expect(changed.status).toBe(200);
		expect(changed.headers.get('etag')).not.toBe(etag);
		expect(await changed.text()).toContain('Renamed runner card');
	});

	it('are kept without their art and fonts, and answered with both inline, as if drawn with them', async () => {
		const game = await loadGame(w.db, w.gameId);
		let withArt: (typeof game.cards)[number] | undefined;
		for (const c of game.cards) {
			const kind = game.kinds.find((k) => k.id === c.kindId)!;
			if ((await renderFaceTemplate({ game, kind, card: c, side: 'front' })).face.art.length) withArt = c;
		}
		// The demo game's runner cards carry art.
		expect(withArt).toBeDefined();
		const card = withArt!;
		const kind = game.kinds.find((k) => k.id === card.kindId)!;
		const before = faceCacheStats();
		const svg = await (await cardFace.GET(ev({ params: { gameId: w.gameId, cardId: card.id }, path: '/?guides=trim' }))).text();
		const after = faceCacheStats();

		// The same face drawn the plain way: each art file's bytes inline (svg.ts's own base64), fonts added as before.
		const fonts = await loadFonts();
		const images = artAssets(game);
		for (const image of images.values()) image.bytes = await readArtFile(image.id);
		const drawn = renderSvg(layoutFace({ game, kind, card, side: 'front', images, fonts }), images, { guides: { trim: true } });
		expect(svg.replace(/<style>.*?<\/style>/, '')).toBe(drawn);

		// Each inline image decodes to the file its hash names (FIPS 180-4 SHA-256, node:crypto).
		const uris = [...svg.matchAll(/href="data:image\/(?:png|jpeg);base64,([^"]+)"/g)].map((m) => Buffer.from(m[1], 'base64'));
		for (const bytes of uris) expect(images.has(createHash('sha256').update(bytes).digest('hex'))).toBe(true);
		// The fonts inline are the shipped woff2 files, byte for byte.
		const require = createRequire(import.meta.url);
		const inline = [...svg.matchAll(/data:font\/woff2;base64,([^)]+)\)/g)].map((m) => Buffer.from(m[1], 'base64'));
		expect(inline).toEqual([
			await readFile(require.resolve('@fontsource/roboto-slab/files/roboto-slab-latin-400-normal.woff2')),
			await readFile(require.resolve('@fontsource/roboto-slab/files/roboto-slab-latin-700-normal.woff2'))
		]);

		// What the cache took for it is a fraction of what was sent.
		expect(after.entries).toBe(before.entries + 1);
		expect(after.bytes - before.bytes).toBeLessThan(svg.length / 2);
		expect(uris.length).toBeGreaterThan(0);
	});

	it('an outsider gets no face and no 304, even with the right ETag', async () => {
		const game = await loadGame(w.db, w.gameId);
		const params = { gameId: w.gameId, cardId: game.cards[0].id };
		const etag = (await cardFace.GET(ev({ params }))).headers.get('etag')!;
		const res = await cardFace.GET(fakeEvent(w.callers.outsider, { params, headers: { 'if-none-match': etag } }) as never);
		expect(res.status).toBe(404);
	});
});

describe('proof faces', () => {
	it('are immutable and revalidate to 304', async () => {
		const game = await loadGame(w.db, w.gameId);
		const proof = await cutProof(w.db, actorIn(w, 'designer'), { description: 'cache test' });
		const params = { gameId: w.gameId, proofId: proof.id, cardId: game.cards[0].id };
		const first = await proofFace.GET(ev({ params }));
		expect(first.status).toBe(200);
		expect(first.headers.get('cache-control')).toMatch(/immutable/);
		const again = await proofFace.GET(ev({ params, headers: { 'if-none-match': first.headers.get('etag')! } }));
		expect(again.status).toBe(304);
	});
});

describe('PNG zip jobs', () => {
	it('refuse a resolution out of range before any work starts', async () => {
		const printJobs = await import('../../src/routes/api/v1/games/[gameId=id]/print-jobs/+server');
		const res = await printJobs.POST(ev({ method: 'POST', params: { gameId: w.gameId }, json: { kind: 'pngs', query: { dpi: '5000' } }, headers: { origin: 'http://localhost:3000' } }));
		expect(res.status).toBe(400);
		expect(((await res.json()) as { error: { message: string } }).error.message).toMatch(/dpi is a whole number from 72 to 600/);
	});
});
