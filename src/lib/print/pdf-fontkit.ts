/**
 * fontkit for pdf-lib, shared across documents: one parsed font per typeface file, and each
 * string's shaping (fontkit's `layout`, GSUB/GPOS) remembered. Shaping the same card texts again
 * for every PDF was the larger part of drawing a sheet; a rebuild now shapes only new strings.
 *
 * pdf-lib sees each font through a thin proxy, one per document, that changes two things:
 * - `layout` is remembered per string (pdf-lib only reads the glyph ids and advance widths of a
 *   result, so one result may serve many documents);
 * - `characterSet` / `glyphForCodePoint` also list the glyphs shaping produced that the font's
 *   cmap does not reach (the fi and fl ligatures, alternates). A whole (not subset) font gets
 *   its widths (/W, ISO 32000-1 §9.7.4.3) and ToUnicode entries only for the glyphs pdf-lib
 *   lists from these; without them a ligature would print with a default width, leaving a gap.
 *   The ligature's entry carries the letters it stands for, so text extraction reads "fi".
 *
 * A process that starts often (the print CLI) can keep what it learnt of a font between runs
 * (`keepFontRecords`): the metrics, glyph widths and code points pdf-lib embeds, and each shaped
 * string's glyphs. The next run embeds the font and places those strings from that record, and
 * loads fontkit (slow to start) only when it meets a string it has not shaped before.
 */
import { fontkitModule as fontkit, type Fontkit } from './fontkit-module';

/** Enough for every string of a large game; past it the memo starts over rather than grow without bound. */
const MAX_SHAPED_STRINGS = 50_000;
/** Stand-in code points for glyphs outside the cmap: above Unicode's last (U+10FFFF), so never a real one. */
const BEYOND_UNICODE = 0x110000;

type Font = ReturnType<Fontkit['create']>;
type Run = ReturnType<Font['layout']>;
type Glyph = Run['glyphs'][number];

/** A parsed font with its remembered shaping, shared by every document of the process. */
interface SharedFont {
	font: Font;
	/** Per string: the run, and its glyphs the cmap does not reach (usually none). */
	shaped: Map<string, { run: Run; beyondCmap: Glyph[] }>;
	cmapGlyphs: Set<number>;
	/** Answered from a kept record, not parsed from the file. */
	fromRecord?: true;
}

const fonts = new Map<string, SharedFont>();

/** FNV-1a over the bytes, with their length: tells the few typeface files apart without a crypto module. */
function fileKey(bytes: Uint8Array): string {
	let h = 0x811c9dc5;
	for (let i = 0; i < bytes.length; i++) h = Math.imul(h ^ bytes[i], 0x01000193);
	return `${bytes.length}:${(h >>> 0).toString(16)}`;
}

function share(font: Font): SharedFont {
	const cmapGlyphs = new Set<number>();
	for (const cp of font.characterSet) cmapGlyphs.add(font.glyphForCodePoint(cp).id);
	return { font, shaped: new Map(), cmapGlyphs };
}

/** A string's shaping, remembered in the shared font. */
function shapedIn({ font, shaped, cmapGlyphs }: SharedFont, sharedKey: string, text: string, features?: unknown) {
	const key = features === undefined ? text : `${text}\u0000${JSON.stringify(features)}`;
	let entry = shaped.get(key);
	if (!entry) {
		if (shaped.size >= MAX_SHAPED_STRINGS) shaped.clear();
		changed.add(sharedKey);
		const run = font.layout(text, features as never);
		entry = { run, beyondCmap: run.glyphs.filter((g) => !cmapGlyphs.has(g.id) && g.codePoints.length) };
		shaped.set(key, entry);
	}
	return entry;
}

/**
 * One document's view of a shared font. The glyphs beyond the cmap it lists are the ones this
 * document's texts produced, so the same texts always give the same font dictionaries, whatever
 * else the process printed before.
 */
function forDocument(shared: SharedFont, sharedKey: string): Font {
	const { font } = shared;
	/** Glyphs shaping produced beyond the cmap, with the code points they stand for. */
	const extra = new Map<number, Glyph>();

	const layout = (text: string, features?: unknown, ...rest: unknown[]): Run => {
		if (rest.length) return font.layout(text, features as never, ...(rest as []));
		const entry = shapedIn(shared, sharedKey, text, features);
		for (const g of entry.beyondCmap) if (!extra.has(g.id)) extra.set(g.id, g);
		return entry.run;
	};
	const glyphForCodePoint = (cp: number) => (cp >= BEYOND_UNICODE ? extra.get(cp - BEYOND_UNICODE)! : font.glyphForCodePoint(cp));

	// The proxy's target is a blank object: fontkit freezes some of its cached properties, and a
	// proxy may not report other values for a frozen property of its own target.
	return new Proxy({} as Font, {
		get(_blank, prop) {
			if (prop === 'layout') return layout;
			if (prop === 'glyphForCodePoint') return glyphForCodePoint;
			if (prop === 'characterSet') return [...font.characterSet, ...[...extra.keys()].map((id) => BEYOND_UNICODE + id)];
			const value = Reflect.get(font, prop, font);
			// fontkit's own methods run on the font itself, never through the proxy.
			return typeof value === 'function' ? value.bind(font) : value;
		}
	});
}

/** Forget every parsed font and shaped string (a cold start, for benchmarks). */
export function forgetSharedFonts(): void {
	fonts.clear();
	changed.clear();
}

/** Pass to `PDFDocument.registerFontkit`. */
export const sharedFontkit = {
	create(bytes: Uint8Array, postscriptName?: string): Font {
		const key = `${fileKey(bytes)}:${postscriptName ?? ''}`;
		let shared = fonts.get(key);
		if (!shared) {
			const record = postscriptName === undefined ? records?.read(key) : undefined;
			const fromFile = !(record && record.v === RECORD_VERSION && record.key === key);
			shared = fromFile ? share(fontkit().create(bytes, postscriptName)) : fromRecord(record!, bytes);
			fonts.set(key, shared);
			if (fromFile && records) changed.add(key);
		}
		// pdf-lib asks once per font per document.
		return forDocument(shared, key);
	}
};

/**
 * The fontkit font of these TrueType bytes, parsed once for measuring (the layout) and for the
 * documents alike: the tables shaping reads and the glyphs it loads are then read once, not
 * twice, and a string is shaped once for both. A font answered from a record is no parsed
 * font: measuring then parses its own.
 */
export function parsedFont(bytes: Uint8Array): Font {
	const key = `${fileKey(bytes)}:`;
	let shared = fonts.get(key);
	if (!shared) {
		shared = share(fontkit().create(bytes));
		fonts.set(key, shared);
		if (records) changed.add(key);
	}
	if (shared.fromRecord) return fontkit().create(bytes);
	// Shaping through the documents' memo: a line the layout shaped (for its ink box) is not shaped again when drawn.
	const { font } = shared;
	const sharedFont = shared;
	const layout = (text: string, features?: unknown, ...rest: unknown[]): Run =>
		rest.length ? font.layout(text, features as never, ...(rest as [])) : shapedIn(sharedFont, key, text, features).run;
	return new Proxy({} as Font, {
		get(_blank, prop) {
			if (prop === 'layout') return layout;
			const value = Reflect.get(font, prop, font);
			return typeof value === 'function' ? value.bind(font) : value;
		}
	});
}

/* --------------------------------------------------------- kept records */

/** Where font records are kept between processes (see ./disk-cache.ts). */
export interface FontRecordStore {
	read(key: string): FontRecord | undefined;
	write(key: string, record: FontRecord): void;
}

const RECORD_VERSION = 1;
/** Past this many strings a record starts over with the ones of the run that wrote it. */
const MAX_RECORDED_STRINGS = 20_000;

/** A glyph as pdf-lib reads it: id, advance width (font units), the code points it stands for. */
type GlyphRecord = [id: number, advanceWidth: number, codePoints: number[]];

/** What pdf-lib reads of a font to embed it whole and place shaped strings with it. */
export interface FontRecord {
	v: number;
	key: string;
	postscriptName: string | null;
	unitsPerEm: number;
	ascent: number;
	descent: number;
	capHeight: number;
	xHeight: number;
	italicAngle: number;
	bbox: [number, number, number, number];
	cff: boolean;
	familyClass: number | null;
	fixedPitch: boolean;
	italic: boolean;
	/** The cmap: each code point of the character set and its glyph id, in the font's order. */
	characterSet: [codePoint: number, glyphId: number][];
	glyphs: GlyphRecord[];
	/** Shaped strings (the memo's keys) and their glyph ids. */
	shaped: [key: string, glyphIds: number[]][];
}

let records: FontRecordStore | undefined;
/** Shared fonts whose record should be written (made from the font, or new strings shaped since read). */
const changed = new Set<string>();

/** Read font records from `store` for fonts not parsed yet in this process; `saveFontRecords` writes them. */
export function keepFontRecords(store: FontRecordStore | undefined): void {
	records = store;
}

/** Writes the records of fonts that learnt something in this process (no-op without a store). */
export function saveFontRecords(): void {
	if (!records) return;
	for (const key of changed) {
		const shared = fonts.get(key);
		if (shared) records.write(key, toRecord(key, shared));
	}
	changed.clear();
}

interface RecordedGlyph {
	id: number;
	advanceWidth: number;
	codePoints: number[];
}

function toRecord(key: string, { font, shaped }: SharedFont): FontRecord {
	const glyphs = new Map<number, GlyphRecord>();
	const note = (g: Glyph | RecordedGlyph) => {
		if (!glyphs.has(g.id)) glyphs.set(g.id, [g.id, g.advanceWidth, [...g.codePoints]]);
		return g.id;
	};
	const characterSet = font.characterSet.map((cp) => [cp, note(font.glyphForCodePoint(cp))] as [number, number]);
	const strings = [...shaped].slice(-MAX_RECORDED_STRINGS).map(([k, e]) => [k, e.run.glyphs.map(note)] as [string, number[]]);
	const os2 = (font as unknown as { 'OS/2'?: { sFamilyClass?: number } })['OS/2'];
	const f = font as unknown as { post: { isFixedPitch: boolean }; head: { macStyle: { italic: boolean } }; cff?: unknown };
	return {
		v: RECORD_VERSION,
		key,
		postscriptName: font.postscriptName ?? null,
		unitsPerEm: font.unitsPerEm,
		ascent: font.ascent,
		descent: font.descent,
		capHeight: font.capHeight,
		xHeight: font.xHeight,
		italicAngle: font.italicAngle,
		bbox: [font.bbox.minX, font.bbox.minY, font.bbox.maxX, font.bbox.maxY],
		cff: !!f.cff,
		familyClass: os2 ? (os2.sFamilyClass ?? 0) : null,
		fixedPitch: !!f.post.isFixedPitch,
		italic: !!f.head.macStyle.italic,
		characterSet,
		glyphs: [...glyphs.values()],
		shaped: strings
	};
}

/**
 * A font answered from its record: what pdf-lib reads of a font, and the recorded strings'
 * shaping. A string not in the record, or anything else asked of the font (a subset), goes to
 * the font itself, parsed then.
 */
function fromRecord(r: FontRecord, bytes: Uint8Array): SharedFont {
	const glyphById = new Map<number, RecordedGlyph>(r.glyphs.map(([id, advanceWidth, codePoints]) => [id, { id, advanceWidth, codePoints }]));
	const byCodePoint = new Map<number, RecordedGlyph>();
	for (const [cp, id] of r.characterSet) byCodePoint.set(cp, glyphById.get(id)!);
	let parsed: Font | undefined;
	const real = (): Font => {
		parsed ??= fontkit().create(bytes);
		return parsed;
	};
	const recorded = {
		postscriptName: r.postscriptName,
		unitsPerEm: r.unitsPerEm,
		ascent: r.ascent,
		descent: r.descent,
		capHeight: r.capHeight,
		xHeight: r.xHeight,
		italicAngle: r.italicAngle,
		bbox: { minX: r.bbox[0], minY: r.bbox[1], maxX: r.bbox[2], maxY: r.bbox[3] },
		cff: r.cff ? true : undefined,
		'OS/2': r.familyClass === null ? undefined : { sFamilyClass: r.familyClass },
		post: { isFixedPitch: r.fixedPitch },
		head: { macStyle: { italic: r.italic } },
		characterSet: r.characterSet.map(([cp]) => cp),
		glyphForCodePoint: (cp: number) => byCodePoint.get(cp) ?? real().glyphForCodePoint(cp),
		// Reached only for strings not in the record: the memo below holds the recorded ones.
		layout: (text: string, features?: unknown) => real().layout(text, features as never),
		createSubset: () => real().createSubset()
	};
	const shaped = new Map<string, { run: Run; beyondCmap: Glyph[] }>();
	const cmapGlyphs = new Set(r.characterSet.map(([, id]) => id));
	for (const [k, ids] of r.shaped) {
		const glyphs = ids.map((id) => glyphById.get(id)!) as unknown as Glyph[];
		shaped.set(k, { run: { glyphs } as unknown as Run, beyondCmap: glyphs.filter((g) => !cmapGlyphs.has(g.id) && g.codePoints.length) });
	}
	return { font: recorded as unknown as Font, shaped, cmapGlyphs, fromRecord: true };
}
