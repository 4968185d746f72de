/**
 * The one typeface of every card: Roboto Slab, shipped with the app (never a system font,
 * so output does not depend on the machine). resvg reads the woff2 files as they are;
 * pdf-lib needs TrueType, so the woff2 is decompressed once per process (the metrics measured
 * from either are the same: ./typeface.ts).
 */
import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import type { FontWeight } from './display-list';
import { FONT_FILES as FILES } from './font-files';
import { parsedFont } from './pdf-fontkit';
import type { MeasuringFont } from './typeface';

export { FONT_FAMILY } from './font-files';

const require = createRequire(import.meta.url);

/** A weight's files: what a PDF embeds. */
export interface FontFile {
	weight: FontWeight;
	woff2: Uint8Array;
	ttf: Uint8Array;
}

export interface LoadedFont extends FontFile, MeasuringFont {}

export type FontFiles = Record<FontWeight, FontFile>;
export type FontSet = Record<FontWeight, LoadedFont>;

let reading: Promise<FontFiles> | undefined;
let loading: Promise<FontSet> | undefined;

/**
 * Both weights' files, once per process. Parsing them (fontkit) is left to `loadFonts`: a PDF
 * whose faces are all known already embeds the files and never loads the parser.
 */
export function loadFontFiles(): Promise<FontFiles> {
	reading ??= (async () => {
		// Required, not imported: the compiled CLI runs from a V8 code cache, where import() is not available.
		const wawoff = require('wawoff2') as typeof import('wawoff2').default;
		// One at a time: wawoff2 returns a view into its wasm heap, which the next call overwrites,
		// so each result is copied before the next decompression starts.
		const one = async (weight: FontWeight): Promise<FontFile> => {
			const woff2 = new Uint8Array(await readFile(require.resolve(FILES[weight])));
			return { weight, woff2, ttf: new Uint8Array(await wawoff.decompress(woff2)) };
		};
		const regular = await one('regular');
		const bold = await one('bold');
		return { regular, bold };
	})();
	return reading;
}

/** Both weights with their metrics, loaded once per process. */
export function loadFonts(): Promise<FontSet> {
	loading ??= (async () => {
		const files = await loadFontFiles();
		// The same parsed font the PDFs embed (./pdf-fontkit.ts): one parse, its tables read once.
		const withMetrics = (f: FontFile): LoadedFont => ({ ...f, metrics: parsedFont(f.ttf) });
		return { regular: withMetrics(files.regular), bold: withMetrics(files.bold) };
	})();
	return loading;
}
