/**
 * The one typeface of every card: Roboto Slab, shipped with the app (never a system font,
 * so output does not depend on the machine). resvg reads the woff2 files as they are;
 * pdf-lib needs TrueType, so the woff2 is decompressed once per process (the metrics measured
 * from either are the same: ./typeface.ts).
 */
import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import fontkit from '@pdf-lib/fontkit';
import wawoff from 'wawoff2';
import type { FontWeight } from './display-list';
import { FONT_FILES as FILES, type MeasuringFont } from './typeface';

export { FONT_FAMILY } from './typeface';

const require = createRequire(import.meta.url);

export interface LoadedFont extends MeasuringFont {
	weight: FontWeight;
	woff2: Uint8Array;
	ttf: Uint8Array;
}

export type FontSet = Record<FontWeight, LoadedFont>;

let loading: Promise<FontSet> | undefined;

async function loadOne(weight: FontWeight): Promise<LoadedFont> {
	const woff2 = new Uint8Array(await readFile(require.resolve(FILES[weight])));
	const ttf = new Uint8Array(await wawoff.decompress(woff2));
	return { weight, woff2, ttf, metrics: fontkit.create(Buffer.from(ttf)) };
}

/** Both weights, loaded once per process. */
export function loadFonts(): Promise<FontSet> {
	// One at a time: wawoff2 returns a view into its wasm heap, which the next call overwrites,
	// so each result is copied (in loadOne) before the next decompression starts.
	loading ??= (async () => {
		const regular = await loadOne('regular');
		const bold = await loadOne('bold');
		return { regular, bold };
	})();
	return loading;
}
