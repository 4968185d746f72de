import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { strToU8, zipSync } from 'fflate';
import { beforeAll, describe, expect, it } from 'vitest';
import { BundleError, MAX_BUNDLE_UNCOMPRESSED_BYTES, readBundle, sha256Hex, writeBundle } from './bundle';
import { demoGame } from '$lib/demo/demo';
import type { ArtAsset, Game } from './model';

/** Two tiny art files (not real images: the bundle only carries bytes). */
const artA = strToU8('first art bytes');
const artB = strToU8('<svg xmlns="http://www.w3.org/2000/svg"/>');
const asset = (id: string, bytes: Uint8Array, mime: ArtAsset['mime'], targetId: string): ArtAsset => ({
	id,
	sha256: sha256Hex(bytes),
	mime,
	widthPx: 10,
	heightPx: 20,
	dpiX: 72,
	status: 'sketch',
	fileName: `${id}.bin`,
	assignment: { scope: 'runner', targetId, slot: 'portrait' }
});

function gameWithArt(): { game: Game; art: Map<string, Uint8Array> } {
	const game = demoGame();
	game.art = [
		asset('a1', artA, 'image/png', 'rn-rosehip'),
		// The same bytes used twice: stored once.
		asset('a2', artA, 'image/png', 'rn-saffron'),
		asset('a3', artB, 'image/svg+xml', 'rn-burrowback')
	];
	return { game, art: new Map([[sha256Hex(artA), artA], [sha256Hex(artB), artB]]) };
}

const u32le = (d: Uint8Array, at: number, v: number) => new DataView(d.buffer, d.byteOffset).setUint32(at, v, true);
const findSig = (d: Uint8Array, sig: number) => {
	for (let i = d.length - 4; i >= 0; i--) if (new DataView(d.buffer, d.byteOffset).getUint32(i, true) === sig) return i;
	return -1;
};

describe('sha256Hex', () => {
	// Example value quoted from memory; Node's hash is OpenSSL's, written independently of this project.
	it('matches the FIPS 180-2 example for "abc"', () => {
		expect(sha256Hex(strToU8('abc'))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
	});
});

describe('game bundle', () => {
	let bytes: Uint8Array;
	let source: ReturnType<typeof gameWithArt>;
	beforeAll(() => {
		source = gameWithArt();
		bytes = writeBundle(source.game, source.art);
	});

	it('round trip reproduces the game and its art exactly', () => {
		const back = readBundle(bytes);
		expect(back.game).toEqual(source.game);
		expect(JSON.stringify(back.game)).toBe(JSON.stringify(source.game));
		expect([...back.art.keys()].sort()).toEqual([...source.art.keys()].sort());
		for (const [sha, data] of back.art) expect(sha256Hex(data)).toBe(sha);
	});

	it('writes the same bytes for the same game', () => {
		expect(sha256Hex(writeBundle(source.game, source.art))).toBe(sha256Hex(bytes));
	});

	it('is a valid zip for an independent reader (Info-ZIP unzip -t), with the expected names', () => {
		const dir = mkdtempSync(join(tmpdir(), 'bundle-'));
		const file = join(dir, 'game.zip');
		writeFileSync(file, bytes);
		const out = execFileSync('unzip', ['-t', file], { encoding: 'utf8' });
		expect(out).toContain('No errors detected');
		const names = execFileSync('unzip', ['-Z1', file], { encoding: 'utf8' }).trim().split('\n');
		expect(names).toEqual(['game.json', `art/${sha256Hex(artA)}.png`, `art/${sha256Hex(artB)}.svg`]);
		const json = JSON.parse(execFileSync('unzip', ['-p', file, 'game.json'], { encoding: 'utf8' }));
		expect(json.kind).toBe('paddock-game');
		expect(json.formatVersion).toBe(1);
	});

	it('refuses bytes that are not a zip', () => {
		expect(() => readBundle(strToU8('hello, this is not a zip file at all'))).toThrow(BundleError);
		expect(() => readBundle(new Uint8Array(0))).toThrow(/not a readable zip/);
	});

	it('refuses a truncated zip', () => {
		expect(() => readBundle(bytes.subarray(0, bytes.length - 30))).toThrow(BundleError);
		expect(() => readBundle(bytes.subarray(0, Math.floor(bytes.length / 2)))).toThrow(BundleError);
	});

	it('refuses a zip whose compressed data was damaged (CRC-32 check)', () => {
		const damaged = bytes.slice();
		// game.json's compressed data starts after its local header (30 bytes + name).
		damaged[30 + 'game.json'.length + 40] ^= 0xff;
		expect(() => readBundle(damaged)).toThrow(/damaged/);
	});

	it('refuses a foreign zip: no game.json, no marker, or another format version', () => {
		expect(() => readBundle(zipSync({ 'readme.txt': strToU8('hi') }))).toThrow(/no game.json/);
		expect(() => readBundle(zipSync({ 'game.json': strToU8('{"name":"x"}') }))).toThrow(/no paddock-game marker/);
		const newer = { ...JSON.parse(JSON.stringify(source.game)), kind: 'paddock-game', formatVersion: 2 };
		expect(() => readBundle(zipSync({ 'game.json': strToU8(JSON.stringify(newer)) }))).toThrow(/format 2, made by a newer Paddock/);
		expect(() => readBundle(zipSync({ 'game.json': strToU8('not json') }))).toThrow(/not valid JSON/);
	});

	it('refuses art whose bytes do not hash to their name', () => {
		const { game } = gameWithArt();
		const sha = sha256Hex(artA);
		const json = strToU8(JSON.stringify({ kind: 'paddock-game', ...game }));
		const zip = zipSync({
			'game.json': json,
			[`art/${sha}.png`]: strToU8('other bytes'),
			[`art/${sha256Hex(artB)}.svg`]: artB
		});
		expect(() => readBundle(zip)).toThrow(`art/${sha}.png is damaged or altered: its bytes do not hash to its name`);
	});

	it('refuses art listed in game.json but missing from the zip, and files it does not list', () => {
		const { game } = gameWithArt();
		const json = strToU8(JSON.stringify({ kind: 'paddock-game', ...game }));
		expect(() => readBundle(zipSync({ 'game.json': json, [`art/${sha256Hex(artA)}.png`]: artA }))).toThrow(
			/a3\.bin.*is missing/
		);
		const extra = zipSync({
			'game.json': json,
			[`art/${sha256Hex(artA)}.png`]: artA,
			[`art/${sha256Hex(artB)}.svg`]: artB,
			'notes.txt': strToU8('x')
		});
		expect(() => readBundle(extra)).toThrow(/does not list: “notes.txt”/);
	});

	it('refuses a game that fails the schemas or has broken references', () => {
		const game = JSON.parse(JSON.stringify(demoGame()));
		game.runners[0].colourHex = 'red';
		expect(() => readBundle(zipSync({ 'game.json': strToU8(JSON.stringify({ kind: 'paddock-game', ...game })) }))).toThrow(
			/runners\.0\.colourHex/
		);
		const broken = demoGame();
		broken.cards[0] = { ...broken.cards[0], kindId: 'missing' };
		expect(() => writeBundle(broken, new Map())).toThrow(/broken references/);
		expect(() =>
			readBundle(zipSync({ 'game.json': strToU8(JSON.stringify({ kind: 'paddock-game', ...broken })) }))
		).toThrow(/broken references/);
	});

	it('refuses an oversize zip from its headers alone, before inflating (zip bomb guard)', () => {
		// A real entry whose central directory claims 300 MB uncompressed: if the reader trusted
		// it and inflated first it would allocate 300 MB; it must refuse from the header.
		const bomb = zipSync({ 'game.json': strToU8('{}'), 'art/big.png': new Uint8Array(1000) });
		const cd = findSig(bomb, 0x02014b50); // the last central directory entry (art/big.png)
		u32le(bomb, cd + 24, 300 * 1024 * 1024);
		expect(() => readBundle(bomb)).toThrow(/more than 200\.0 MB/);
		expect(MAX_BUNDLE_UNCOMPRESSED_BYTES).toBe(200 * 1024 * 1024);
	});

	it('refuses a header that understates the size (the CRC and length no longer match)', () => {
		const liar = zipSync({ 'game.json': strToU8(JSON.stringify({ kind: 'paddock-game', pad: 'x'.repeat(5000) })) });
		const cd = findSig(liar, 0x02014b50);
		u32le(liar, cd + 24, 100);
		expect(() => readBundle(liar)).toThrow(/damaged/);
	});

	it('refuses to write art whose bytes are missing or wrong', () => {
		const { game } = gameWithArt();
		expect(() => writeBundle(game, new Map())).toThrow(/were not given/);
		expect(() => writeBundle(game, new Map([[sha256Hex(artA), artB], [sha256Hex(artB), artB]]))).toThrow(/do not hash/);
	});
});
