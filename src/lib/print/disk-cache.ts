/**
 * The print cache on disk, for a process that starts often (the print CLI): laid-out faces, each
 * face's PDF form content (deflated, ready to place), encoded art pixels and font records, kept
 * by the same content keys as the in-memory cache (./cache.ts `faceKey`: card, kind, runner,
 * money table, art, engine and layouts). A repeat run only assembles the PDF; a changed card
 * misses on its own faces and nothing else.
 *
 * One file per entry, written whole under a temporary name and renamed (a reader never sees half
 * a file), framed with a checksum: a truncated or damaged entry reads as missing and is made
 * again. The directory holds nothing else, can be deleted at any time, and is kept under
 * `maxBytes` by removing the least recently used entries after a run that wrote some.
 */
import { createHash } from 'node:crypto';
import { mkdirSync, readdirSync, readFileSync, renameSync, statSync, unlinkSync, utimesSync, writeFileSync } from 'node:fs';
import { homedir } from 'node:os';
import { join } from 'node:path';
import type { FaceLayout } from './display-list';
import type { FontFiles } from './fonts';
import { keepForm, keptFormOf, type ColourMode, type FormRecord } from './pdf';
import type { FontRecord, FontRecordStore } from './pdf-fontkit';
import type { EncodedImageStore, EncodedPixels } from './pdf-image';

/** Default bound of the directory: a few large games' faces and art. */
export const DEFAULT_DISK_CACHE_BYTES = 256 * 1024 * 1024;

/** Bump when the entries' framing or contents change: older files are then never read. */
const FORMAT = 'paddock-print-disk-1';
const MAGIC = new TextEncoder().encode('PDKC');
const HASH_BYTES = 32;

export type DiskArea = 'layout' | 'form' | 'pixels' | 'font';

/** The platform's per-user cache directory (XDG on Linux), with Paddock's print cache inside. */
export function defaultDiskCacheDir(env: NodeJS.ProcessEnv = process.env): string {
	const base =
		env.XDG_CACHE_HOME ||
		(process.platform === 'darwin'
			? join(homedir(), 'Library', 'Caches')
			: process.platform === 'win32'
				? env.LOCALAPPDATA || join(homedir(), 'AppData', 'Local')
				: join(homedir(), '.cache'));
	return join(base, 'paddock', 'print');
}

export interface DiskCacheStats {
	hits: number;
	misses: number;
	/** Entries found damaged (and ignored). */
	damaged: number;
	/** Entries written, by area. */
	written: Record<DiskArea, number>;
}

export class PrintDiskCache implements EncodedImageStore {
	readonly stats: DiskCacheStats = { hits: 0, misses: 0, damaged: 0, written: { layout: 0, form: 0, pixels: 0, font: 0 } };
	private ready = false;
	/** Images already asked for in this process, so `set` after a miss writes once. */
	private pixelMemo = new Map<string, EncodedPixels>();

	constructor(
		readonly dir: string,
		readonly maxBytes = DEFAULT_DISK_CACHE_BYTES
	) {}

	private path(area: DiskArea, key: string): string {
		return join(this.dir, `${area}-${createHash('sha256').update(`${FORMAT}\n${key}`).digest('hex').slice(0, 40)}`);
	}

	/** The entry's bytes, or undefined when missing, unreadable or damaged. */
	read(area: DiskArea, key: string): Uint8Array | undefined {
		const file = this.path(area, key);
		let bytes: Uint8Array;
		try {
			bytes = readFileSync(file);
		} catch {
			this.stats.misses++;
			return undefined;
		}
		const payload = unframe(bytes);
		if (!payload) {
			this.stats.damaged++;
			this.stats.misses++;
			try {
				unlinkSync(file);
			} catch {
				// Already gone, or a read-only directory: it is ignored either way.
			}
			return undefined;
		}
		this.stats.hits++;
		try {
			// Read recently: the last to go when the directory is trimmed.
			const now = new Date();
			utimesSync(file, now, now);
		} catch {
			// A read-only cache still serves.
		}
		return payload;
	}

	/** Keeps the entry; a directory that cannot be written is not an error (the run just makes it again next time). */
	write(area: DiskArea, key: string, payload: Uint8Array): void {
		try {
			if (!this.ready) {
				mkdirSync(this.dir, { recursive: true });
				this.ready = true;
			}
			const file = this.path(area, key);
			const tmp = `${file}.${process.pid}.tmp`;
			writeFileSync(tmp, frame(payload));
			renameSync(tmp, file);
			this.stats.written[area]++;
		} catch {
			// Not kept.
		}
	}

	/* ------------------------------------------------ typed entries */

	readLayout(key: string): FaceLayout | undefined {
		const bytes = this.read('layout', key);
		return bytes && (parseJson(bytes) as FaceLayout | undefined);
	}

	writeLayout(key: string, face: FaceLayout): void {
		this.write('layout', key, new TextEncoder().encode(JSON.stringify(face)));
	}

	readForm(key: string): FormRecord | undefined {
		const parts = unpack(this.read('form', key));
		if (!parts) return undefined;
		const head = parts.head as Omit<FormRecord, 'content'>;
		if (parts.blobs.length !== 1 || (head.colour !== 'rgb' && head.colour !== 'cmyk') || !Array.isArray(head.images) || !Array.isArray(head.texts))
			return undefined;
		return { colour: head.colour, images: head.images, texts: head.texts, content: parts.blobs[0] };
	}

	writeForm(key: string, form: FormRecord): void {
		this.write('form', key, pack({ colour: form.colour, images: form.images, texts: form.texts }, [form.content]));
	}

	/* EncodedImageStore: encoded pixels by ./pdf-image.ts `pixelKey` (a content hash). */
	get(key: string): EncodedPixels | undefined {
		const memo = this.pixelMemo.get(key);
		if (memo) return memo;
		const parts = unpack(this.read('pixels', key));
		if (!parts) return undefined;
		const head = parts.head as { widthPx: number; heightPx: number; channels: 1 | 3 | 4; maxInkPct?: number; alpha: boolean; pngRows?: true };
		if (parts.blobs.length !== (head.alpha ? 2 : 1)) return undefined;
		const pixels: EncodedPixels = {
			widthPx: head.widthPx,
			heightPx: head.heightPx,
			channels: head.channels,
			...(head.maxInkPct !== undefined && { maxInkPct: head.maxInkPct }),
			...(head.pngRows === true && { pngRows: true }),
			colour: parts.blobs[0],
			alpha: head.alpha ? parts.blobs[1] : null
		};
		this.pixelMemo.set(key, pixels);
		return pixels;
	}

	set(key: string, pixels: EncodedPixels): void {
		this.pixelMemo.set(key, pixels);
		const { colour, alpha, ...head } = pixels;
		this.write('pixels', key, pack({ ...head, alpha: !!alpha }, alpha ? [colour, alpha] : [colour]));
	}

	/* FontRecordStore */
	readFont(key: string): FontRecord | undefined {
		const bytes = this.read('font', key);
		return bytes && (parseJson(bytes) as FontRecord | undefined);
	}

	writeFont(key: string, record: FontRecord): void {
		this.write('font', key, new TextEncoder().encode(JSON.stringify(record)));
	}

	/** Removes the least recently used entries (and stray temporary files) until the directory is under `maxBytes`. */
	trim(): { entries: number; bytes: number; removed: number } {
		let names: string[];
		try {
			names = readdirSync(this.dir);
		} catch {
			return { entries: 0, bytes: 0, removed: 0 };
		}
		const files: { file: string; bytes: number; used: number }[] = [];
		let removed = 0;
		for (const name of names) {
			const file = join(this.dir, name);
			try {
				const s = statSync(file);
				// A temporary file older than a minute belongs to a run that stopped half way.
				if (name.endsWith('.tmp')) {
					if (Date.now() - s.mtimeMs > 60_000) (unlinkSync(file), removed++);
					continue;
				}
				files.push({ file, bytes: s.size, used: s.mtimeMs });
			} catch {
				// Removed meanwhile.
			}
		}
		let bytes = files.reduce((n, f) => n + f.bytes, 0);
		files.sort((a, b) => a.used - b.used);
		for (const f of files) {
			if (bytes <= this.maxBytes) break;
			try {
				unlinkSync(f.file);
				bytes -= f.bytes;
				removed++;
			} catch {
				// Someone else's removal won.
			}
		}
		return { entries: files.length - removed, bytes, removed };
	}
}

/** The FontRecordStore face of a disk cache (its own `read`/`write` take an area). */
export const fontRecordsIn = (disk: PrintDiskCache): FontRecordStore => ({
	read: (key) => disk.readFont(key),
	write: (key, record) => disk.writeFont(key, record)
});

/** The font files, for keys of what depends on them (layouts measure with them, forms name their glyph ids). */
export function fontsKey(fonts: FontFiles): string {
	let key = fontKeys.get(fonts);
	if (!key) fontKeys.set(fonts, (key = createHash('sha256').update(fonts.regular.ttf).update(fonts.bold.ttf).digest('hex').slice(0, 20)));
	return key;
}
const fontKeys = new WeakMap<FontFiles, string>();
const formKey = (faceKey: string, colour: ColourMode, fonts: FontFiles) => `${faceKey}|${colour}|${fontsKey(fonts)}`;

/**
 * Gives the faces the forms kept on disk for them (drawn in `colour` with these fonts), so the
 * document places them without drawing. Returns the faces that had none: keep theirs after the
 * document is drawn (`keepDrawnForms`).
 */
export function restoreForms(disk: PrintDiskCache, faces: ReadonlyMap<FaceLayout, string>, colour: ColourMode, fonts: FontFiles): Map<FaceLayout, string> {
	const missing = new Map<FaceLayout, string>();
	for (const [face, key] of faces) {
		if (keptFormOf(face)?.colour === colour) continue;
		const form = disk.readForm(formKey(key, colour, fonts));
		if (form && form.colour === colour) keepForm(face, form, fonts);
		else missing.set(face, key);
	}
	return missing;
}

/** Writes the forms the document drew for these faces. */
export function keepDrawnForms(disk: PrintDiskCache, faces: ReadonlyMap<FaceLayout, string>, colour: ColourMode, fonts: FontFiles): void {
	for (const [face, key] of faces) {
		const form = keptFormOf(face);
		if (form?.colour === colour) disk.writeForm(formKey(key, colour, fonts), form);
	}
}

/* ------------------------------------------------------------ framing */

/** MAGIC, SHA-256 of the payload, the payload. */
function frame(payload: Uint8Array): Uint8Array {
	const out = new Uint8Array(MAGIC.length + HASH_BYTES + payload.length);
	out.set(MAGIC, 0);
	out.set(createHash('sha256').update(payload).digest(), MAGIC.length);
	out.set(payload, MAGIC.length + HASH_BYTES);
	return out;
}

function unframe(bytes: Uint8Array): Uint8Array | undefined {
	if (bytes.length < MAGIC.length + HASH_BYTES) return undefined;
	for (let i = 0; i < MAGIC.length; i++) if (bytes[i] !== MAGIC[i]) return undefined;
	const payload = bytes.subarray(MAGIC.length + HASH_BYTES);
	const sum = createHash('sha256').update(payload).digest();
	for (let i = 0; i < HASH_BYTES; i++) if (sum[i] !== bytes[MAGIC.length + i]) return undefined;
	return payload;
}

/** A JSON head and binary blobs: [u32 head length][head][u32 count]([u32 length][bytes])… */
function pack(head: unknown, blobs: Uint8Array[]): Uint8Array {
	const json = new TextEncoder().encode(JSON.stringify(head));
	const out = new Uint8Array(8 + json.length + blobs.reduce((n, b) => n + 4 + b.length, 0));
	const view = new DataView(out.buffer);
	let at = 0;
	view.setUint32(at, json.length);
	out.set(json, (at += 4));
	view.setUint32((at += json.length), blobs.length);
	at += 4;
	for (const b of blobs) {
		view.setUint32(at, b.length);
		out.set(b, (at += 4));
		at += b.length;
	}
	return out;
}

function unpack(bytes: Uint8Array | undefined): { head: Record<string, unknown>; blobs: Uint8Array[] } | undefined {
	if (!bytes) return undefined;
	try {
		const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
		let at = 0;
		const headLength = view.getUint32(at);
		const head = JSON.parse(new TextDecoder().decode(bytes.subarray((at += 4), (at += headLength))));
		const count = view.getUint32(at);
		at += 4;
		const blobs: Uint8Array[] = [];
		for (let i = 0; i < count; i++) {
			const n = view.getUint32(at);
			at += 4;
			if (at + n > bytes.length) return undefined;
			blobs.push(bytes.subarray(at, (at += n)));
		}
		return head && typeof head === 'object' ? { head, blobs } : undefined;
	} catch {
		return undefined;
	}
}

function parseJson(bytes: Uint8Array): unknown {
	try {
		return JSON.parse(new TextDecoder().decode(bytes));
	} catch {
		return undefined;
	}
}
