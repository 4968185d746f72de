/**
 * A game bundle's art passes the same inspection as an upload: hostile files are refused with a
 * clear 400 and nothing of the game is made; accepted art gets thumbnails like uploaded art.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { count, eq } from 'drizzle-orm';
import { PNG } from 'pngjs';
import { openWorld, type World, actorIn } from './harness';
import { exportBundle, importBundle } from '$lib/server/game-io';
import { openArtFile } from '$lib/server/art-files';
import { Invalid } from '$lib/server/refusals';
import { games } from '$lib/server/db/schema';
import { writeBundle } from '$lib/game/bundle';
import type { Game } from '$lib/game/model';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

/** The demo game's bundle with one more art piece: `bytes`, claimed to be a 10 × 10 `mime`. */
async function bundleWith(bytes: Uint8Array, mime: 'image/png' | 'image/svg+xml', fileName: string) {
	const { game } = await exportBundle(w.db, w.gameId);
	const art = new Map<string, Uint8Array>();
	for (const a of game.art) art.set(a.sha256, (await (await import('$lib/server/art-files')).readArtFile(a.sha256)));
	art.set(sha(bytes), bytes);
	const withArt: Game = {
		...game,
		art: [...game.art, { id: 'art-extra', sha256: sha(bytes), mime, widthPx: 10, heightPx: 10, status: 'sketch', fileName, assignment: null, version: 1 }]
	};
	return writeBundle(withArt, art);
}

const gameCount = async () => (await w.db.select({ n: count() }).from(games).where(eq(games.teamId, w.teamId)))[0].n;

async function refused(zip: Uint8Array) {
	const before = await gameCount();
	const e = await importBundle(w.db, actorIn(w, 'designer'), { zip }).then(
		() => null,
		(x) => x
	);
	expect(e).toBeInstanceOf(Invalid);
	expect((e as Invalid).reason).toBe('invalid');
	expect(await gameCount()).toBe(before);
	return (e as Error).message;
}

describe('bundle import inspects art', () => {
	it('refuses an SVG with a script', async () => {
		const svg = new TextEncoder().encode('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script></svg>');
		expect(await refused(await bundleWith(svg, 'image/svg+xml', 'evil.svg'))).toMatch(/evil\.svg was refused/);
	});

	it('refuses a PNG whose data holds more pixels than its header says', async () => {
		const png = new PNG({ width: 400, height: 400 });
		png.data.fill(200);
		const bytes = new Uint8Array(PNG.sync.write(png, { filterType: 0 }));
		new DataView(bytes.buffer).setUint32(20, 10); // header: 400 × 10
		expect(await refused(await bundleWith(bytes, 'image/png', 'liar.png'))).toMatch(/liar\.png was refused.*more pixels/);
	});

	it('refuses a PNG over the pixel cap by its header alone', async () => {
		const png = new PNG({ width: 8, height: 8 });
		const bytes = new Uint8Array(PNG.sync.write(png));
		new DataView(bytes.buffer).setUint32(16, 30000);
		new DataView(bytes.buffer).setUint32(20, 30000);
		expect(await refused(await bundleWith(bytes, 'image/png', 'huge.png'))).toMatch(/huge\.png was refused.*30000 × 30000/);
	});

	it('keeps what the file is, not what the bundle claims, and makes thumbnails', async () => {
		const png = new PNG({ width: 640, height: 320 });
		png.data.fill(90);
		const bytes = new Uint8Array(PNG.sync.write(png));
		const row = await importBundle(w.db, actorIn(w, 'designer'), { zip: await bundleWith(bytes, 'image/png', 'fine.png') });
		const { game } = await exportBundle(w.db, row.id);
		const extra = game.art.find((a) => a.id === 'art-extra')!;
		expect([extra.widthPx, extra.heightPx]).toEqual([640, 320]);
		for (const a of game.art) expect((await openArtFile(a.sha256, true)).thumbnail, a.fileName).toBe(true);
	});
});

describe('served art files', () => {
	it('carry CSP default-src none and nosniff; an SVG downloads as an attachment, its thumbnail does not', async () => {
		const { fakeEvent } = await import('./harness');
		const artFileApi = await import('../../src/routes/api/v1/games/[gameId=id]/art-files/[sha256]/+server');
		const { uploadArt } = await import('$lib/server/art-uploads');
		const bytes = new TextEncoder().encode('<svg xmlns="http://www.w3.org/2000/svg" width="40" height="20"><rect width="40" height="20" fill="#3a6"/></svg>');
		const { art: svg } = await uploadArt(w.db, actorIn(w, 'designer'), { bytes, fileName: 'plain.svg' });
		const get = async (sha256: string, thumb = false) =>
			(await artFileApi.GET(
				fakeEvent(w.callers.designer, { path: `/x${thumb ? '?thumb=1' : ''}`, params: { gameId: w.gameId, sha256 } }) as never
			)) as Response;
		const original = await get(svg.sha256);
		expect(original.headers.get('content-security-policy')).toMatch(/^default-src 'none'/);
		expect(original.headers.get('x-content-type-options')).toBe('nosniff');
		expect(original.headers.get('content-disposition')).toMatch(/^attachment/);
		const thumb = await get(svg.sha256, true);
		expect(thumb.headers.get('content-type')).toBe('image/png');
		expect(thumb.headers.get('content-security-policy')).toMatch(/^default-src 'none'/);
		expect(thumb.headers.get('content-disposition')).toBeNull();
	});
});
