/**
 * PNG backend: SVG (from ./svg.ts) → PNG through resvg (WebAssembly), with the shipped fonts only.
 */
import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { initWasm, Resvg } from '@resvg/resvg-wasm';
import { PNG } from 'pngjs';
import { MM_PER_INCH } from '../game/model';
import { faceWidthMm, type FaceLayout } from './display-list';
import { FONT_FAMILY, loadFonts } from './fonts';
import { renderSvg, type ImageSource, type SvgOptions } from './svg';

let ready: Promise<void> | undefined;

/**
 * resvg's wasm may be initialised only once per process; every caller here shares this promise.
 * Another module of the process may have initialised it first, which is just as good.
 */
export function resvgReady(): Promise<void> {
	ready ??= (async () => {
		const wasmPath = createRequire(import.meta.url).resolve('@resvg/resvg-wasm/index_bg.wasm');
		try {
			await initWasm(await readFile(wasmPath));
		} catch (e) {
			if (!String((e as Error).message).includes('Already initialized')) throw e;
		}
	})();
	return ready;
}

/** 8-bit RGBA pixels, row by row, as a PNG file (thumbnails, soft proofs). */
export function rgbaToPng(rgba: Uint8Array, widthPx: number, heightPx: number): Uint8Array {
	const image = new PNG({ width: widthPx, height: heightPx });
	image.data = Buffer.from(rgba.buffer, rgba.byteOffset, rgba.byteLength);
	return new Uint8Array(PNG.sync.write(image));
}

/** The root element gives its size in mm. */
const MM_SIZED = /^\s*(?:<\?xml[^>]*>\s*)?<svg\b[^>]*\swidth="[\d.]+mm"/;

/** Pixels across `mm` at `dpi`, rounded to whole pixels. */
export const mmToPx = (mm: number, dpi: number) => Math.round((mm / MM_PER_INCH) * dpi);

export interface PngOptions {
	/** Width of the SVG's canvas in mm (the face with its bleed). */
	widthMm: number;
	dpi: number;
	/** CSS colour behind the artwork; transparent unless given. */
	background?: string;
}

export interface RenderedPng {
	png: Uint8Array;
	widthPx: number;
	heightPx: number;
}

/** Rasterise an SVG at `dpi`: the output is round(widthMm / 25.4 × dpi) pixels wide. */
export async function svgToPng(svg: string, opts: PngOptions): Promise<RenderedPng> {
	const [, fonts] = await Promise.all([resvgReady(), loadFonts()]);
	const font = {
		fontBuffers: [fonts.regular.woff2, fonts.bold.woff2],
		// Output must never depend on the machine's fonts.
		loadSystemFonts: false,
		defaultFontFamily: FONT_FAMILY,
		serifFamily: FONT_FAMILY
	};
	const resvg = new Resvg(svg, {
		// An SVG sized in mm (our faces) is zoomed by dpi / 96 (resvg reads mm at 96 px per inch,
		// CSS 2.1 §4.3.2), which rounds each side on its own: round(mm / 25.4 × dpi) both ways.
		// Anything else is fitted to the width.
		fitTo: MM_SIZED.test(svg) ? { mode: 'zoom', value: opts.dpi / 96 } : { mode: 'width', value: mmToPx(opts.widthMm, opts.dpi) },
		background: opts.background,
		font
	});
	try {
		const image = resvg.render();
		try {
			return { png: image.asPng(), widthPx: image.width, heightPx: image.height };
		} finally {
			image.free();
		}
	} finally {
		resvg.free();
	}
}

/** One face (with bleed) as PNG, e.g. the per-card 300 dpi files. */
export function renderFacePng(
	face: FaceLayout,
	images: ImageSource,
	opts: { dpi: number; svg?: SvgOptions; background?: string }
): Promise<RenderedPng> {
	const svg = renderSvg(face, images, opts.svg);
	return svgToPng(svg, { widthMm: faceWidthMm(face), dpi: opts.dpi, background: opts.background });
}
