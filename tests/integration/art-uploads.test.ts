/**
 * Artwork uploads through the API route and the Art page's form actions: hostile files are
 * refused with their status and message and leave nothing behind (no stored file, no row);
 * a valid file is stored once however often it is sent; a replace keeps the earlier file.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { crc32 } from 'node:zlib';
import { count, eq } from 'drizzle-orm';
import { Jimp } from 'jimp';
import { imageSize } from 'image-size';
import { openWorld, superformJson, testStorage, type World } from './harness';
import { as, g } from './role-table';
import { useStorage, storageFor, type Storage } from '$lib/server/storage';
import { artFiles, artVersions, gameObjects, games } from '$lib/server/db/schema';
import { loadGame } from '$lib/server/game-store';
import { readArtFile } from '$lib/server/art-files';
import * as uploadApi from '../../src/routes/api/v1/games/[gameId=id]/art/upload/+server';
import * as artFileApi from '../../src/routes/api/v1/games/[gameId=id]/art-files/[sha256]/+server';
import * as readyz from '../../src/routes/readyz/+server';
import * as healthz from '../../src/routes/healthz/+server';
import * as artPage from '../../src/routes/(app)/games/[gameId=id]/art/+page.server';

let w: World;
let store: Storage;

beforeAll(async () => {
	w = await openWorld();
	// A store of our own, empty at the start, so every file an upload writes can be seen.
	store = testStorage();
	useStorage(store);
});
afterAll(async () => w?.close());

/* ------------------------------------------------------------ files */

/** A plain PNG drawn by jimp (an independent encoder). */
async function png(widthPx: number, heightPx: number, rgba = 0x3f7d5aff): Promise<Uint8Array> {
	return new Uint8Array(await new Jimp({ width: widthPx, height: heightPx, color: rgba }).getBuffer('image/png'));
}

/**
 * A PNG whose header claims 30000 × 30000 px (900 megapixels) with no pixel data behind it.
 * Layout from ISO/IEC 15948:2004: the 8-byte signature (§5.2), then the IHDR chunk (§11.2.2):
 * length, type, width and height as 4-byte big-endian integers, bit depth 8, colour type 6
 * (RGBA), compression, filter, interlace 0, and a CRC-32 over type and data (§5.3); then IEND.
 */
function claimsHugePng(): Uint8Array {
	const chunk = (type: string, data: Buffer) => {
		const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
		const out = Buffer.alloc(12 + data.length);
		out.writeUInt32BE(data.length, 0);
		body.copy(out, 4);
		out.writeUInt32BE(crc32(body), 8 + data.length);
		return out;
	};
	const ihdr = Buffer.alloc(13);
	ihdr.writeUInt32BE(30000, 0);
	ihdr.writeUInt32BE(30000, 4);
	ihdr.set([8, 6, 0, 0, 0], 8);
	const signature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
	return new Uint8Array(Buffer.concat([signature, chunk('IHDR', ihdr), chunk('IEND', Buffer.alloc(0))]));
}

/** GIF89a signature (GIF89a specification, 1990, §17) and a logical screen: a GIF named .png. */
const gifNamedPng = () => new Uint8Array([...Buffer.from('GIF89a', 'latin1'), 10, 0, 10, 0, 0, 0, 0, 0x3b]);

const svgWithScript = () =>
	new TextEncoder().encode('<svg xmlns="http://www.w3.org/2000/svg" width="40" height="40"><script>alert(1)</script><rect width="40" height="40"/></svg>');

const svgWithOutsideHref = () =>
	new TextEncoder().encode(
		'<svg xmlns="http://www.w3.org/2000/svg" width="40" height="40"><image href="https://example.com/a.png" width="40" height="40"/></svg>'
	);

/** 25 MiB and one byte, starting like a PNG: over the cap whatever it holds. */
const overCap = () => {
	const bytes = new Uint8Array(25 * 1024 * 1024 + 1);
	bytes.set([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
	return bytes;
};

/* ------------------------------------------------------------ calls */

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

function multipart(bytes: Uint8Array, fileName: string, fields: Record<string, string> = {}) {
	const fd = new FormData();
	fd.set('file', new File([new Uint8Array(bytes)], fileName));
	for (const [k, v] of Object.entries(fields)) fd.set(k, v);
	return fd;
}

async function apiUpload(who: 'artist' | 'designer' | 'owner', bytes: Uint8Array, fileName: string, fields: Record<string, string> = {}, raw = false) {
	const call = raw
		? {
				method: 'POST',
				path: `/?${new URLSearchParams(fields)}`,
				body: new Uint8Array(bytes),
				headers: { 'content-type': 'application/octet-stream', 'x-file-name': fileName }
			}
		: { method: 'POST', body: multipart(bytes, fileName, fields) };
	const res = (await uploadApi.POST(as(w, who, { params: g(w), ...call }))) as Response;
	return { status: res.status, body: await res.json() };
}

/** The page's upload action; its refusals are action failures carrying the form and its message. */
async function pageUpload(bytes: Uint8Array, fileName: string, fields: Record<string, string> = {}) {
	try {
		const result = (await artPage.actions.upload(as(w, 'artist', { params: g(w), body: multipart(bytes, fileName, fields) }))) as unknown as {
			status: number;
			data: { form: { message?: string; errors: Record<string, string[]> } };
		};
		return { status: result.status, message: result.data.form.message, errors: result.data.form.errors };
	} catch (e) {
		const r = e as { status?: number; location?: string };
		if (r.status === 303) return { status: 303, location: r.location };
		throw e;
	}
}

/* ---------------------------------------------------------- snapshot */

async function snapshot() {
	const [[files], [versions], [objects], [game]] = await Promise.all([
		w.db.select({ n: count() }).from(artFiles),
		w.db.select({ n: count() }).from(artVersions),
		w.db.select({ n: count() }).from(gameObjects).where(eq(gameObjects.gameId, w.gameId)),
		w.db.select({ version: games.version }).from(games).where(eq(games.id, w.gameId))
	]);
	return { artFiles: files.n, artVersions: versions.n, gameObjects: objects.n, gameVersion: game.version, disk: (await store.list('art/')).map((k) => k.slice('art/'.length)) };
}

/* ------------------------------------------------------------- tests */

describe('hostile uploads are refused and store nothing', () => {
	const cases: { name: string; bytes: () => Uint8Array; fileName: string; status: number; message: RegExp }[] = [
		{ name: 'wrong magic bytes (a GIF named .png)', bytes: gifNamedPng, fileName: 'portrait.png', status: 400, message: /not a PNG, JPEG or SVG image: “portrait\.png” is a GIF image/ },
		{ name: 'a PNG whose header claims 30000 × 30000 px', bytes: claimsHugePng, fileName: 'huge.png', status: 400, message: /30000 × 30000 px \(900 megapixels\); Paddock accepts up to 100 megapixels/ },
		{ name: 'an SVG with a script', bytes: svgWithScript, fileName: 'badge.svg', status: 400, message: /^(Nothing was stored\. )?This SVG contains .*script/ },
		{ name: 'an SVG with an outside href', bytes: svgWithOutsideHref, fileName: 'linked.svg', status: 400, message: /This SVG contains a link to an outside file \(.*https:\/\/example\.com\/a\.png/ },
		{ name: 'a file over 25 MB', bytes: overCap, fileName: 'big.png', status: 413, message: /Paddock accepts art files up to 25 MB/ }
	];

	for (const c of cases) {
		it(`API multipart: ${c.name} → ${c.status}`, async () => {
			const before = await snapshot();
			const res = await apiUpload('artist', c.bytes(), c.fileName, { status: 'final', scope: 'kind', targetId: 'kd-setup', slot: 'backArt' });
			expect(res.status).toBe(c.status);
			expect(res.body.error.message).toMatch(c.message);
			expect(await snapshot()).toEqual(before);
		});
		it(`API raw body: ${c.name} → ${c.status}`, async () => {
			const before = await snapshot();
			const res = await apiUpload('designer', c.bytes(), c.fileName, {}, true);
			expect(res.status).toBe(c.status);
			expect(res.body.error.message).toMatch(c.message);
			expect(await snapshot()).toEqual(before);
		});
		it(`page form: ${c.name} → ${c.status}`, async () => {
			const before = await snapshot();
			const res = await pageUpload(c.bytes(), c.fileName, { status: 'sketch', place: 'kind kd-setup backArt' });
			expect(res.status).toBe(c.status);
			expect(res.message).toMatch(c.message);
			expect(res.message).toMatch(/^Nothing was stored\./);
			expect(await snapshot()).toEqual(before);
		});
	}

	it('a body far over the cap is refused before it is read (413)', async () => {
		const before = await snapshot();
		const bytes = new Uint8Array(30 * 1024 * 1024);
		const res = await apiUpload('owner', bytes, 'huge.jpg', {}, true);
		expect(res.status).toBe(413);
		expect(res.body.error.message).toBe('This file is larger than 25 MB; Paddock accepts art files up to 25 MB.');
		const page = await pageUpload(bytes, 'huge.jpg');
		expect(page.status).toBe(413);
		expect(await snapshot()).toEqual(before);
	});

	it('a bad field or a missing target is refused before anything is written', async () => {
		const before = await snapshot();
		const bytes = await png(20, 20);
		const badStatus = await apiUpload('artist', bytes, 'a.png', { status: 'done' });
		expect(badStatus.status).toBe(400);
		expect(badStatus.body.error.message).toMatch(/^status:/);
		const half = await apiUpload('artist', bytes, 'a.png', { scope: 'kind', targetId: 'kd-setup' });
		expect(half.status).toBe(400);
		expect(half.body.error.message).toMatch(/give scope, targetId and slot together/);
		const missing = await apiUpload('artist', bytes, 'a.png', { scope: 'card', targetId: 'no-such-card', slot: 'icon' });
		expect(missing.status).toBe(400);
		expect(missing.body.error.message).toMatch(/assigned to a missing card/);
		const noName = (await uploadApi.POST(as(w, 'artist', { params: g(w), method: 'POST', body: new Uint8Array(bytes) }))) as Response;
		expect(noName.status).toBe(400);
		expect((await noName.json()).error.message).toMatch(/x-file-name/);
		expect(await snapshot()).toEqual(before);
	});
});

describe('valid uploads', () => {
	let first: { id: string; sha256: string; bytes: Uint8Array };

	it('stores the file, its thumbnail, one art_files row, version 1 and the asset', async () => {
		const before = await snapshot();
		const bytes = await png(200, 200);
		const res = await apiUpload('artist', bytes, 'setup-back-rough.png', { status: 'final', scope: 'kind', targetId: 'kd-setup', slot: 'backArt' }, true);
		expect(res.status).toBe(201);
		const sha = sha256(bytes);
		expect(res.body.art).toMatchObject({ sha256: sha, mime: 'image/png', widthPx: 200, heightPx: 200, status: 'final', fileName: 'setup-back-rough.png' });
		expect(res.body.art.assignment).toEqual({ scope: 'kind', targetId: 'kd-setup', slot: 'backArt' });
		expect(res.body.version).toMatchObject({ number: 1, sha256: sha, fileName: 'setup-back-rough.png' });
		// The slot's earlier art is kept, no longer assigned (a slot prints one piece).
		expect(res.body.displaced).toEqual(['art-back-pebble-1']);
		const game = await loadGame(w.db, w.gameId);
		expect(game.art.find((a) => a.id === 'art-back-pebble-1')?.assignment).toBeNull();

		// The setup card's shared back: poker 63.5 × 88.9 mm plus 3 mm metric bleed per side
		// (common practice) = 69.5 × 94.9 mm. Scaled to cover it, the square's 200 px span the
		// 94.9 mm height: 200 / (94.9 / 25.4) = 53.5 dpi (25.4 mm per inch exactly, 1959 yard).
		expect(res.body.print).toMatchObject({ basis: 'layout', dpi: 53, ok: false, minDpi: 300 });
		expect(res.body.print.slotMm.widthMm).toBeCloseTo(69.5, 6);
		expect(res.body.print.slotMm.heightMm).toBeCloseTo(94.9, 6);
		// 300 dpi needs ceil(69.5 / 25.4 × 300) = 821 and ceil(94.9 / 25.4 × 300) = 1121 px.
		expect(res.body.print.neededPx).toEqual({ widthPx: 821, heightPx: 1121 });

		const after = await snapshot();
		expect(after.artFiles).toBe(before.artFiles + 1);
		expect(after.artVersions).toBe(before.artVersions + 1);
		expect(after.gameObjects).toBe(before.gameObjects + 1);
		expect(after.disk).toEqual([...before.disk, `${sha.slice(0, 2)}/${sha}`, `${sha.slice(0, 2)}/${sha}.thumb.png`].sort());

		// The stored file reads back as the same picture (jimp decodes it on its own).
		const served = (await artFileApi.GET(as(w, 'reviewer', { params: g(w, { sha256: sha }) }))) as Response;
		expect(served.status).toBe(200);
		const back = new Uint8Array(await served.arrayBuffer());
		expect(sha256(back)).toBe(sha);
		const decoded = await Jimp.read(Buffer.from(back));
		expect([decoded.width, decoded.height]).toEqual([200, 200]);
		const thumb = (await artFileApi.GET(as(w, 'reviewer', { path: '/?thumb=1', params: g(w, { sha256: sha }) }))) as Response;
		expect(thumb.headers.get('content-type')).toBe('image/png');
		const t = imageSize(new Uint8Array(await thumb.arrayBuffer()));
		expect(Math.max(t.width, t.height)).toBeLessThanOrEqual(320);
		first = { id: res.body.art.id, sha256: sha, bytes };
	});

	it('art read for printing is read from the store once, then kept by its hash', async () => {
		const read = await readArtFile(first.sha256);
		expect(sha256(read)).toBe(first.sha256);
		// The second read is the very bytes kept: the store is not asked again.
		expect(await readArtFile(first.sha256)).toBe(read);
		await expect(readArtFile('../not-a-hash')).rejects.toThrow(/Not an art file name/);
	});

	it('the same bytes sent again make a second asset but no second file', async () => {
		const before = await snapshot();
		const res = await apiUpload('designer', first.bytes, 'same-again.png');
		expect(res.status).toBe(201);
		expect(res.body.art.id).not.toBe(first.id);
		expect(res.body.art.sha256).toBe(first.sha256);
		expect(res.body.art.assignment).toBeNull();
		expect(res.body.art.status).toBe('sketch');
		const after = await snapshot();
		expect(after.artFiles).toBe(before.artFiles);
		expect(after.disk).toEqual(before.disk);
		expect(after.artVersions).toBe(before.artVersions + 1);
		const [{ n }] = await w.db.select({ n: count() }).from(artFiles).where(eq(artFiles.sha256, first.sha256));
		expect(n).toBe(1);
	});

	it('replacing keeps the asset id and the earlier file; version numbers count up', async () => {
		const bytes = await png(900, 1200, 0xb5452cff);
		const res = await apiUpload('artist', bytes, 'setup-back-final.png', { replaces: first.id, version: '1' });
		expect(res.status).toBe(200);
		expect(res.body.art).toMatchObject({ id: first.id, sha256: sha256(bytes), widthPx: 900, heightPx: 1200, fileName: 'setup-back-final.png', version: 2 });
		// Assignment and status stay with the asset.
		expect(res.body.art).toMatchObject({ status: 'final', assignment: { scope: 'kind', targetId: 'kd-setup', slot: 'backArt' } });
		expect(res.body.version.number).toBe(2);
		const rows = await w.db.select().from(artVersions).where(eq(artVersions.artId, first.id));
		expect(rows.map((r) => [r.number, r.sha256]).sort()).toEqual([
			[1, first.sha256],
			[2, sha256(bytes)]
		]);
		// The earlier file is still on disk and still served for this game.
		const old = (await artFileApi.GET(as(w, 'artist', { params: g(w, { sha256: first.sha256 }) }))) as Response;
		expect(old.status).toBe(200);
		expect(sha256(new Uint8Array(await old.arrayBuffer()))).toBe(first.sha256);
	});

	it('a replace from a stale version is refused (409) and stores nothing', async () => {
		const before = await snapshot();
		const bytes = await png(64, 64, 0xe0a526ff);
		const res = await apiUpload('artist', bytes, 'late.png', { replaces: first.id, version: '1' });
		expect(res.status).toBe(409);
		expect(res.body.error.message).toMatch(/Someone saved this art piece after you opened it/);
		expect(await snapshot()).toEqual(before);
		expect(before.disk).not.toContain(`${sha256(bytes).slice(0, 2)}/${sha256(bytes)}`);
	});

	it('the page replaces a file too, and shows every version with the warning', async () => {
		const bytes = await png(1000, 1400, 0x1f4d3aff);
		const result = (await artPage.actions.replace(
			as(w, 'artist', { params: g(w), body: multipart(bytes, 'setup-back-v3.png', { artId: first.id, version: '2', status: 'keep' }) })
		)) as { form: { message: string } };
		expect(result.form.message).toMatch(/^Replaced\. “setup-back-v3\.png” is version 3/);

		const data = (await artPage.load(as(w, 'reviewer', { path: `/?art=${first.id}`, params: g(w) }))) as Awaited<ReturnType<typeof artPage.load>>;
		const piece = data.art.find((a) => a.id === first.id)!;
		expect(piece.versions.map((v) => v.number)).toEqual([3, 2, 1]);
		expect(piece.versions.map((v) => v.fileName)).toEqual(['setup-back-v3.png', 'setup-back-final.png', 'setup-back-rough.png']);
		// 1000 px over 69.5 mm = 365.5 dpi, 1400 px over 94.9 mm = 374.7 dpi: the lower counts; no warning now.
		expect(piece.print).toMatchObject({ ok: true, dpi: 365 });
		// The demo's deliberately coarse Pebble portrait (150 px) is flagged.
		const pebble = data.art.find((a) => a.id === 'art-portrait-rn-pebble')!;
		expect(pebble.print.ok).toBe(false);
		expect(pebble.print.dpi).toBeLessThan(300);
	});

	it('the page uploads new art and opens it', async () => {
		const before = await snapshot();
		const res = await pageUpload(await png(120, 80), 'sketchy.png', { status: 'placeholder', place: '' });
		expect(res.status).toBe(303);
		expect(res.location).toMatch(new RegExp(`^/games/${w.gameId}/art\\?art=[0-9a-f-]{36}&uploaded=1$`));
		const after = await snapshot();
		expect(after.gameObjects).toBe(before.gameObjects + 1);
		expect(after.artFiles).toBe(before.artFiles + 1);
	});

	it('changing the slot takes it over from the earlier holder', async () => {
		const game = await loadGame(w.db, w.gameId);
		const pebble = game.art.find((a) => a.id === 'art-back-pebble-1')!;
		const result = (await artPage.actions.save(
			as(w, 'artist', {
				params: g(w),
				form: { __superform_id: 'placement', ...superformJson({ id: pebble.id, status: 'final', assignment: { scope: 'kind', targetId: 'kd-setup', slot: 'backArt' }, version: pebble.version }) }
			})
		)) as {
			form: { message: string; data: { version: number } };
			saved: { art: { id: string; version: number; place: string | null }[]; places: { options: { key: string; holder: { id: string } | null }[] }[] };
		};
		expect(result.form.message).toMatch(/^Saved\. It prints on Setup cards · Card back \(shared by every card\)\. “setup-back-v3\.png” no longer prints there/);
		// The answer holds what the page shows after the move, so the browser needs no reload: the new
		// version for the next save, where each piece now prints, and who holds the place.
		expect(result.form.data.version).toBe(pebble.version! + 1);
		expect(result.saved.art.find((a) => a.id === pebble.id)).toMatchObject({ version: pebble.version! + 1, place: 'Setup cards · Card back (shared by every card)' });
		expect(result.saved.art.find((a) => a.id === first.id)?.place).toBeNull();
		const place = result.saved.places.flatMap((p) => p.options).find((o) => o.holder?.id === pebble.id);
		expect(place).toBeDefined();
		const after = await loadGame(w.db, w.gameId);
		expect(after.art.find((a) => a.id === first.id)?.assignment).toBeNull();
		expect(after.art.find((a) => a.id === pebble.id)?.assignment).toEqual({ scope: 'kind', targetId: 'kd-setup', slot: 'backArt' });
	});
});

describe('the file store out of reach', () => {
	// A bucket address where nothing listens: every request to it fails to connect.
	const unreachable = storageFor('s3://key:secret@paddock?endpoint=http%3A%2F%2F127.0.0.1%3A1&region=us-east-1', '');

	it('/readyz answers 503 naming the store; /healthz still 200', async () => {
		const ready = (await readyz.GET(as(w, 'anonymous'))) as Response;
		expect(ready.status).toBe(200);
		useStorage(unreachable);
		try {
			const res = (await readyz.GET(as(w, 'anonymous'))) as Response;
			expect(res.status).toBe(503);
			const body = await res.json();
			expect(body).toMatchObject({ ready: false, database: 'ok' });
			expect(body.storage).toMatch(/Cannot reach the bucket paddock at 127\.0\.0\.1:1/);
			expect(JSON.stringify(body)).not.toContain('secret');
			expect(((await healthz.GET(as(w, 'anonymous'))) as Response).status).toBe(200);
		} finally {
			useStorage(store);
		}
	});

	it('uploads answer 503 and nothing is half-written: no row, no asset, no version', async () => {
		const before = await snapshot();
		useStorage(unreachable);
		try {
			const res = await apiUpload('artist', await png(64, 64, 0x224466ff), 'while-down.png');
			expect(res.status).toBe(503);
			expect(res.body.error.message).toMatch(/file store cannot be reached.*nothing was stored/i);
			const page = await pageUpload(await png(64, 64, 0x224467ff), 'while-down-2.png', { status: 'sketch', place: '' });
			expect(page.status).toBe(503);
			expect(page.message).toMatch(/^Nothing was stored\. The file store cannot be reached/);
		} finally {
			useStorage(store);
		}
		expect(await snapshot()).toEqual(before);
	});
});
