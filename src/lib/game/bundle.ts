/**
 * The game bundle: one zip file that carries a whole game between installations.
 *
 *   game.json              { kind: 'paddock-game', formatVersion: 1, ...the game }
 *   art/<sha256>.<ext>     each distinct art file once, named by the SHA-256 of its bytes
 *
 * Reading is strict, because a bundle comes from outside: the zip's central directory is checked
 * (entry count, declared sizes, encryption) before anything is inflated, so a zip bomb is refused
 * without being unpacked; every entry's CRC-32 is checked after; art must hash to its name; the
 * game must pass the same schemas as the forms and have no broken references.
 */
import { createHash } from 'node:crypto';
import { crc32 } from 'node:zlib';
import { strFromU8, strToU8, unzipSync, zipSync, type Zippable } from 'fflate';
import { ART_EXTENSIONS, findReferenceProblems, GAME_FORMAT_VERSION, GameSchema, type ArtAsset, type Game } from './model';

export const BUNDLE_MARKER = 'paddock-game';
export const GAME_JSON = 'game.json';
/** Everything inside a bundle, uncompressed, must fit in this. */
export const MAX_BUNDLE_UNCOMPRESSED_BYTES = 200 * 1024 * 1024;
export const MAX_BUNDLE_ENTRIES = 10_000;

export class BundleError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'BundleError';
	}
}

export interface ReadBundle {
	game: Game;
	/** Art bytes by SHA-256 (lower-case hex). */
	art: Map<string, Uint8Array>;
}

export function sha256Hex(bytes: Uint8Array): string {
	return createHash('sha256').update(bytes).digest('hex');
}

export function artPath(asset: Pick<ArtAsset, 'sha256' | 'mime'>): string {
	return `art/${asset.sha256}.${ART_EXTENSIONS[asset.mime]}`;
}

/** A fixed date keeps the zip's bytes the same for the same game (no clock in the output). */
const ZIP_MTIME = new Date(2000, 0, 1);

function describeSchemaError(issues: readonly { path: readonly PropertyKey[]; message: string }[]): string {
	const shown = issues.slice(0, 5).map((i) => `${i.path.map(String).join('.') || '(top)'}: ${i.message}`);
	const more = issues.length > 5 ? ` (and ${issues.length - 5} more)` : '';
	return shown.join('; ') + more;
}

/** Art files of a game, one per distinct hash. Throws when two assets give one hash two types. */
function distinctArt(game: Game): Map<string, ArtAsset> {
	const bySha = new Map<string, ArtAsset>();
	for (const asset of game.art) {
		const other = bySha.get(asset.sha256);
		if (other && other.mime !== asset.mime)
			throw new BundleError(`Art ${asset.sha256} is listed as both ${other.mime} and ${asset.mime}`);
		bySha.set(asset.sha256, asset);
	}
	return bySha;
}

/* ------------------------------------------------------------------- write */

export function writeBundle(game: Game, artBytes: Map<string, Uint8Array>): Uint8Array {
	const parsed = GameSchema.safeParse(game);
	if (!parsed.success) throw new BundleError(`The game is not valid: ${describeSchemaError(parsed.error.issues)}`);
	const problems = findReferenceProblems(parsed.data);
	if (problems.length > 0)
		throw new BundleError(`The game has broken references: ${problems.map((p) => p.message).join('; ')}`);

	const files: Zippable = {};
	let total = 0;
	for (const [sha, asset] of distinctArt(parsed.data)) {
		const bytes = artBytes.get(sha);
		if (!bytes) throw new BundleError(`The bytes of art “${asset.fileName}” (${sha}) were not given`);
		if (sha256Hex(bytes) !== sha) throw new BundleError(`The bytes given for art “${asset.fileName}” do not hash to ${sha}`);
		total += bytes.length;
		// PNG and JPEG are compressed already; storing them saves time and nothing else.
		files[artPath(asset)] = [bytes, { level: asset.mime === 'image/svg+xml' ? 6 : 0 }];
	}
	const { formatVersion, ...rest } = parsed.data;
	const json = strToU8(JSON.stringify({ kind: BUNDLE_MARKER, formatVersion, ...rest }, null, '\t'));
	total += json.length;
	if (total > MAX_BUNDLE_UNCOMPRESSED_BYTES)
		throw new BundleError(`The bundle would hold ${mb(total)}; the limit is ${mb(MAX_BUNDLE_UNCOMPRESSED_BYTES)}`);
	// game.json first, so a reader can find the marker without the art.
	return zipSync({ [GAME_JSON]: [json, { level: 6 }], ...files }, { mtime: ZIP_MTIME });
}

const mb = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MB`;

/* -------------------------------------------------------------------- read */

interface DirectoryEntry {
	name: string;
	crc: number;
	compressedSize: number;
	size: number;
	method: number;
}

const u16 = (d: Uint8Array, at: number) => d[at] | (d[at + 1] << 8);
const u32 = (d: Uint8Array, at: number) => (d[at] | (d[at + 1] << 8) | (d[at + 2] << 16) | (d[at + 3] << 24)) >>> 0;

/**
 * The zip's central directory (PKWARE APPNOTE.TXT §4.3.12 entries, §4.3.16 end record; section
 * numbers from memory), read without inflating anything.
 * Zip64 and encrypted entries are refused: a game bundle never needs them.
 */
function readDirectory(zip: Uint8Array): DirectoryEntry[] {
	const damaged = (why: string) => new BundleError(`The file is not a readable zip (${why})`);
	if (zip.length < 22) throw damaged('too short');
	// End of central directory record: signature 0x06054b50, found within the last 64 KiB + 22 bytes.
	let eocd = -1;
	for (let at = zip.length - 22; at >= Math.max(0, zip.length - 22 - 0xffff); at--)
		if (u32(zip, at) === 0x06054b50) {
			eocd = at;
			break;
		}
	if (eocd < 0) throw damaged('no end of central directory');
	const count = u16(zip, eocd + 10);
	const dirSize = u32(zip, eocd + 12);
	const dirOffset = u32(zip, eocd + 16);
	if (count === 0xffff || dirOffset === 0xffffffff) throw new BundleError('Zip64 archives are not game bundles');
	if (count > MAX_BUNDLE_ENTRIES) throw new BundleError(`The zip holds ${count} files; a bundle holds at most ${MAX_BUNDLE_ENTRIES}`);
	if (dirOffset + dirSize > eocd) throw damaged('central directory out of bounds');

	const entries: DirectoryEntry[] = [];
	let at = dirOffset;
	let total = 0;
	for (let i = 0; i < count; i++) {
		if (at + 46 > eocd || u32(zip, at) !== 0x02014b50) throw damaged(`bad directory entry ${i + 1}`);
		const flags = u16(zip, at + 8);
		const method = u16(zip, at + 10);
		const crc = u32(zip, at + 16);
		const compressedSize = u32(zip, at + 20);
		const size = u32(zip, at + 24);
		const nameLength = u16(zip, at + 28);
		const extraLength = u16(zip, at + 30);
		const commentLength = u16(zip, at + 32);
		const localOffset = u32(zip, at + 42);
		if (at + 46 + nameLength > eocd) throw damaged(`bad directory entry ${i + 1}`);
		const name = new TextDecoder().decode(zip.subarray(at + 46, at + 46 + nameLength));
		if (flags & 1) throw new BundleError(`“${name}” is encrypted; bundles are never encrypted`);
		if (method !== 0 && method !== 8) throw new BundleError(`“${name}” uses an unknown compression method (${method})`);
		if (size === 0xffffffff || compressedSize === 0xffffffff || localOffset === 0xffffffff)
			throw new BundleError('Zip64 archives are not game bundles');
		if (localOffset + 30 + compressedSize > dirOffset) throw damaged(`“${name}” runs past the end of the data`);
		total += size;
		if (total > MAX_BUNDLE_UNCOMPRESSED_BYTES)
			throw new BundleError(
				`The zip unpacks to more than ${mb(MAX_BUNDLE_UNCOMPRESSED_BYTES)} (limit for a game bundle); it was not unpacked`
			);
		entries.push({ name, crc, compressedSize, size, method });
		at += 46 + nameLength + extraLength + commentLength;
	}
	return entries;
}

export function readBundle(bytes: Uint8Array): ReadBundle {
	if (!(bytes instanceof Uint8Array)) throw new BundleError('Expected the bundle as bytes');
	const entries = readDirectory(bytes);
	const byName = new Map<string, DirectoryEntry>();
	for (const e of entries) {
		if (byName.has(e.name)) throw new BundleError(`“${e.name}” appears twice in the zip`);
		byName.set(e.name, e);
	}
	if (!byName.has(GAME_JSON)) throw new BundleError('This zip is not a Paddock game bundle: it has no game.json');

	let files: Record<string, Uint8Array>;
	try {
		// Sizes were checked above from the directory; fflate inflates into buffers of exactly
		// those sizes, so a lying header cannot make it allocate more.
		files = unzipSync(bytes, { filter: (f) => !f.name.endsWith('/') });
	} catch (e) {
		throw new BundleError(`The zip is damaged: ${(e as Error).message}`);
	}
	for (const [name, data] of Object.entries(files)) {
		const entry = byName.get(name);
		if (!entry || data.length !== entry.size || crc32(data) !== entry.crc)
			throw new BundleError(`The zip is damaged: “${name}” does not match its checksum`);
	}

	let doc: unknown;
	try {
		doc = JSON.parse(strFromU8(files[GAME_JSON]));
	} catch {
		throw new BundleError('game.json is damaged: it is not valid JSON');
	}
	if (!doc || typeof doc !== 'object' || (doc as { kind?: unknown }).kind !== BUNDLE_MARKER)
		throw new BundleError('This zip is not a Paddock game bundle: game.json has no paddock-game marker');
	const { kind: _marker, ...rest } = doc as Record<string, unknown>;
	const format = rest.formatVersion;
	if (typeof format !== 'number') throw new BundleError('game.json does not say which format version it is');
	if (format > GAME_FORMAT_VERSION)
		throw new BundleError(
			`The bundle is format ${format}, made by a newer Paddock; this one reads format ${GAME_FORMAT_VERSION}`
		);
	if (format !== GAME_FORMAT_VERSION)
		throw new BundleError(`The bundle is format ${format}; this Paddock reads format ${GAME_FORMAT_VERSION}`);

	const parsed = GameSchema.safeParse(rest);
	if (!parsed.success) throw new BundleError(`game.json is not a valid game: ${describeSchemaError(parsed.error.issues)}`);
	const game = parsed.data;
	const problems = findReferenceProblems(game);
	if (problems.length > 0)
		throw new BundleError(`game.json has broken references: ${problems.slice(0, 5).map((p) => p.message).join('; ')}`);

	const art = new Map<string, Uint8Array>();
	const expected = new Set([GAME_JSON]);
	for (const [sha, asset] of distinctArt(game)) {
		const path = artPath(asset);
		expected.add(path);
		const data = files[path];
		if (!data) throw new BundleError(`Art “${asset.fileName}” is listed in game.json but ${path} is missing`);
		if (sha256Hex(data) !== sha) throw new BundleError(`${path} is damaged or altered: its bytes do not hash to its name`);
		art.set(sha, data);
	}
	for (const name of Object.keys(files))
		if (!expected.has(name)) throw new BundleError(`The bundle holds a file game.json does not list: “${name}”`);
	return { game, art };
}
