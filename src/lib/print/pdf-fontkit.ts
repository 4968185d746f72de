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
 */
import fontkit from '@pdf-lib/fontkit';

/** Enough for every string of a large game; past it the memo starts over rather than grow without bound. */
const MAX_SHAPED_STRINGS = 50_000;
/** Stand-in code points for glyphs outside the cmap: above Unicode's last (U+10FFFF), so never a real one. */
const BEYOND_UNICODE = 0x110000;

type Font = ReturnType<typeof fontkit.create>;
type Run = ReturnType<Font['layout']>;
type Glyph = Run['glyphs'][number];

/** A parsed font with its remembered shaping, shared by every document of the process. */
interface SharedFont {
	font: Font;
	/** Per string: the run, and its glyphs the cmap does not reach (usually none). */
	shaped: Map<string, { run: Run; beyondCmap: Glyph[] }>;
	cmapGlyphs: Set<number>;
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

/**
 * One document's view of a shared font. The glyphs beyond the cmap it lists are the ones this
 * document's texts produced, so the same texts always give the same font dictionaries, whatever
 * else the process printed before.
 */
function forDocument({ font, shaped, cmapGlyphs }: SharedFont): Font {
	/** Glyphs shaping produced beyond the cmap, with the code points they stand for. */
	const extra = new Map<number, Glyph>();

	const layout = (text: string, features?: unknown, ...rest: unknown[]): Run => {
		if (rest.length) return font.layout(text, features as never, ...(rest as []));
		const key = features === undefined ? text : `${text}\u0000${JSON.stringify(features)}`;
		let entry = shaped.get(key);
		if (!entry) {
			if (shaped.size >= MAX_SHAPED_STRINGS) shaped.clear();
			const run = font.layout(text, features as never);
			entry = { run, beyondCmap: run.glyphs.filter((g) => !cmapGlyphs.has(g.id) && g.codePoints.length) };
			shaped.set(key, entry);
		}
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
}

/** Pass to `PDFDocument.registerFontkit`. */
export const sharedFontkit = {
	create(bytes: Uint8Array, postscriptName?: string): Font {
		const key = `${fileKey(bytes)}:${postscriptName ?? ''}`;
		let shared = fonts.get(key);
		if (!shared) {
			shared = share(fontkit.create(bytes, postscriptName));
			fonts.set(key, shared);
		}
		// pdf-lib asks once per font per document.
		return forDocument(shared);
	}
};
