/**
 * Colour management for press output, through LittleCMS (lcms-wasm: the C library compiled to
 * WebAssembly), never through formulas of our own: art and colours are sRGB (what screens, image
 * editors and the web assume), the press speaks the CMYK of its printing condition, and the ICC
 * output profile is the only honest map between them.
 *
 * - `PressColour.cmykOf`: one sRGB colour → the profile's CMYK (vector fills and strokes);
 * - `PressColour.pixelsToCmyk`: 8-bit RGB pixels → 8-bit CMYK (art);
 * - `PressColour.softProof`: RGB pixels → how they will print, back on screen, with the colour
 *   difference (CIEDE2000, ./delta-e.ts) of each pixel so the out-of-gamut ones can be marked.
 *
 * Rendering intents (ICC.1:2010 §6.2): relative colorimetric with black-point compensation by
 * default (in-gamut colours stay exact, the darkest art black maps to the press's darkest black),
 * perceptual as the choice for photographic art with much colour outside the press gamut.
 */
import * as lcms from 'lcms-wasm';
import type { Handle, Lcms } from 'lcms-wasm';
import { createHash } from 'node:crypto';
import { checkPressProfile } from './icc';
import { deltaE2000 } from './delta-e';

export type RenderingIntent = 'relative' | 'perceptual';
export const RENDERING_INTENTS = ['relative', 'perceptual'] as const satisfies readonly RenderingIntent[];
export const DEFAULT_INTENT: RenderingIntent = 'relative';

export type Cmyk = [number, number, number, number];

/** A printing condition with its CMYK ICC profile: what a PDF/X file's output intent names and embeds. */
export interface PressProfile {
	/** Short registered name of the condition, e.g. FOGRA39 (PDF/X `OutputConditionIdentifier`). */
	conditionIdentifier: string;
	/** Words for people: paper, process, standard (PDF/X `Info`). */
	condition: string;
	/** Where the identifier is registered, e.g. http://www.color.org (PDF/X `RegistryName`); empty for a custom one. */
	registryName: string;
	/** The ICC profile's bytes (checked with ./icc.ts). */
	icc: Uint8Array;
	/** Highest total area coverage the condition allows, in % (sum of C, M, Y and K). */
	totalInkLimitPct: number;
}

/** SHA-256 of the profile's bytes: names it in caches and keys. */
export function profileKey(icc: Uint8Array): string {
	return createHash('sha256').update(icc).digest('hex');
}

let engine: Promise<Lcms> | undefined;

/** The LittleCMS instance of this process (or worker thread), started once. */
export function colourEngine(): Promise<Lcms> {
	engine ??= lcms.instantiate();
	return engine;
}

const FLOAT_FORMAT = (space: number, channels: number) =>
	lcms.FLOAT_SH(1) | lcms.COLORSPACE_SH(space) | lcms.CHANNELS_SH(channels) | lcms.BYTES_SH(4);
const TYPE_Lab_FLT = FLOAT_FORMAT(lcms.PT_Lab, 3);
const TYPE_CMYK_FLT = FLOAT_FORMAT(lcms.PT_CMYK, 4);

/** Opens profile bytes through the heap: the wrapper's own copy goes through the small wasm stack. */
function openProfile(L: Lcms, bytes: Uint8Array): Handle {
	const ptr = L._malloc(bytes.length);
	try {
		L.HEAPU8.set(bytes, ptr);
		// LittleCMS copies a profile opened from memory, so the block can go at once.
		return L._cmsOpenProfileFromMem(ptr, bytes.length);
	} finally {
		L._free(ptr);
	}
}

/**
 * One press profile with one rendering intent, its transforms built once. Converters are kept
 * per (profile, intent) in the process: building the transforms costs more than using them.
 */
export class PressColour {
	private cmykByHex = new Map<string, Cmyk>();

	private constructor(
		private L: Lcms,
		readonly profileKey: string,
		readonly intent: RenderingIntent,
		readonly description: string,
		private toCmyk8: Handle,
		private toCmykF: Handle,
		private toScreen: Handle,
		private rgbToLab: Handle,
		private cmykToLabBpc: Handle
	) {}

	static async open(icc: Uint8Array, intent: RenderingIntent = DEFAULT_INTENT): Promise<PressColour> {
		checkPressProfile(icc);
		const key = profileKey(icc);
		const known = converters.get(`${key}:${intent}`);
		if (known) return known;
		const L = await colourEngine();
		const press = openProfile(L, icc);
		if (!press) throw new Error('LittleCMS cannot read this ICC profile');
		const srgb = L.cmsCreate_sRGBProfile();
		const lab = L.cmsCreateLab4Profile(null);
		const cmsIntent = intent === 'perceptual' ? lcms.INTENT_PERCEPTUAL : lcms.INTENT_RELATIVE_COLORIMETRIC;
		// Black-point compensation with relative colorimetric (ICC.1:2010 Annex: the art's black is the press's black).
		const flags = intent === 'relative' ? lcms.cmsFLAGS_BLACKPOINTCOMPENSATION : 0;
		const rel = lcms.INTENT_RELATIVE_COLORIMETRIC;
		const transforms = [
			L.cmsCreateTransform(srgb, lcms.TYPE_RGB_8, press, lcms.TYPE_CMYK_8, cmsIntent, flags),
			L.cmsCreateTransform(srgb, lcms.TYPE_RGB_8, press, TYPE_CMYK_FLT, cmsIntent, flags),
			// Back to the screen as printed: relative colorimetric, no compensation, so the press's
			// black shows as the dark grey it really is on paper.
			L.cmsCreateTransform(press, lcms.TYPE_CMYK_8, srgb, lcms.TYPE_RGB_8, rel, 0),
			L.cmsCreateTransform(srgb, lcms.TYPE_RGB_8, lab, TYPE_Lab_FLT, rel, 0),
			// The print measured with black-point compensation: the press's lighter black is then
			// compared as black, so only colours the press cannot reach count as moved.
			L.cmsCreateTransform(press, lcms.TYPE_CMYK_8, lab, TYPE_Lab_FLT, rel, lcms.cmsFLAGS_BLACKPOINTCOMPENSATION)
		];
		const description = L.cmsGetProfileInfoASCII(press, lcms.cmsInfoDescription, 'en', 'US');
		// Transforms keep what they need of the profiles.
		for (const p of [press, srgb, lab]) L.cmsCloseProfile(p);
		if (transforms.some((t) => !t)) {
			for (const t of transforms) if (t) L.cmsDeleteTransform(t);
			throw new Error('LittleCMS cannot build transforms for this ICC profile (is it missing its lookup tables?)');
		}
		const [a, b, c, d, e] = transforms;
		const converter = new PressColour(L, key, intent, description, a, b, c, d, e);
		keep(`${key}:${intent}`, converter);
		return converter;
	}

	/** An sRGB colour (#rrggbb) as the profile's CMYK, 0–1 each. */
	cmykOf(hex: string): Cmyk {
		const h = normaliseHex(hex);
		let cmyk = this.cmykByHex.get(h);
		if (!cmyk) {
			const n = parseInt(h.slice(1), 16);
			const out = this.L.cmsDoTransform(this.toCmykF, new Uint8Array([(n >> 16) & 255, (n >> 8) & 255, n & 255]), 1);
			// LittleCMS's float CMYK is in percent (0–100).
			cmyk = [0, 1, 2, 3].map((i) => clamp01(out[i] / 100)) as Cmyk;
			this.cmykByHex.set(h, cmyk);
		}
		return cmyk;
	}

	/** 8-bit RGB pixels (3 bytes each) → 8-bit CMYK pixels (4 bytes each). */
	pixelsToCmyk(rgb: Uint8Array): Uint8Array {
		return this.L.cmsDoTransform(this.toCmyk8, rgb, rgb.length / 3);
	}

	/** 8-bit CMYK pixels → sRGB as they will look printed. */
	cmykToScreen(cmyk: Uint8Array): Uint8Array {
		return this.L.cmsDoTransform(this.toScreen, cmyk, cmyk.length / 4);
	}

	/**
	 * RGB pixels as they will print, back in sRGB (the press's black as the dark grey it is on
	 * paper), with each pixel's colour difference between the art and the print: CIEDE2000 in
	 * D50 Lab, measured after black-point compensation so that only colours outside the press
	 * gamut (a screen green, a deep blue) move, not every black. Computed once per distinct colour.
	 */
	softProof(rgb: Uint8Array): { rgb: Uint8Array; deltaE2000: Float32Array } {
		const count = rgb.length / 3;
		const cmyk = this.pixelsToCmyk(rgb);
		const asArt: Float32Array = this.L.cmsDoTransform(this.rgbToLab, rgb, count);
		const asPrinted: Float32Array = this.L.cmsDoTransform(this.cmykToLabBpc, cmyk, count);
		const deltaE = new Float32Array(count);
		const known = new Map<number, number>();
		for (let i = 0, j = 0; i < count; i++, j += 3) {
			const colour = (rgb[j] << 16) | (rgb[j + 1] << 8) | rgb[j + 2];
			let d = known.get(colour);
			if (d === undefined) {
				d = deltaE2000(asArt.subarray(j, j + 3), asPrinted.subarray(j, j + 3));
				known.set(colour, d);
			}
			deltaE[i] = d;
		}
		return { rgb: this.cmykToScreen(cmyk), deltaE2000: deltaE };
	}

	/** A CMYK colour (0–1 each, e.g. a runner's press value) as it will look printed, as #rrggbb. */
	screenHexOfCmyk(cmyk: readonly number[]): string {
		const px = this.cmykToScreen(new Uint8Array(cmyk.map((v) => Math.round(clamp01(v) * 255))));
		return `#${[...px].map((v) => v.toString(16).padStart(2, '0')).join('')}`;
	}
}

const clamp01 = (v: number) => Math.min(1, Math.max(0, v));

function normaliseHex(hex: string): string {
	let h = hex.trim().replace(/^#/, '').toLowerCase();
	if (h.length === 3) h = [...h].map((c) => c + c).join('');
	if (!/^[0-9a-f]{6}$/.test(h)) throw new Error(`not a hex colour: ${hex}`);
	return `#${h}`;
}

/** A few profiles × two intents in practice; past this many the oldest converter is dropped. */
const MAX_CONVERTERS = 8;
const converters = new Map<string, PressColour>();

function keep(key: string, converter: PressColour): void {
	converters.set(key, converter);
	// Dropped converters keep their transforms (a few hundred KB of wasm heap each): a rare cost,
	// and no caller can still be holding a deleted transform.
	while (converters.size > MAX_CONVERTERS) converters.delete(converters.keys().next().value!);
}
