/**
 * Images as PDF image XObjects, each written once per document.
 *
 * JPEG goes in as it is (DCTDecode, no re-encoding). An 8-bit PNG keeps its filtered rows
 * (FlateDecode with PNG predictors, ISO 32000-1 §7.4.4.4), split into colour and a separate soft
 * mask (§11.6.5.3) only when the picture has transparency; any other PNG is decoded to pixels
 * and written as our own FlateDecode image (§8.9.5). Much faster than a general-purpose
 * embedder that re-packs every PNG the same way.
 */
import { promisify } from 'node:util';
import { deflate, deflateSync, inflateSync } from 'node:zlib';
import { PDFDocument, PDFName, PDFRef } from 'pdf-lib';
import type { ImageAsset } from './display-list';
import { readPngParts } from '../art/png-chunks';
import type { PressColour } from './colour/cmm';
import { jimp } from './jimp';

export interface DecodedPng {
	widthPx: number;
	heightPx: number;
	/** 1 (grey) or 3 (RGB) colour samples per pixel, 8 bits each. */
	channels: 1 | 3;
	colour: Uint8Array;
	/** One byte per pixel, or null when every pixel is opaque. */
	alpha: Uint8Array | null;
}

/**
 * Decodes a non-interlaced PNG of any colour type and bit depth (PNG spec, ISO/IEC 15948).
 * Returns null for interlaced files, which the caller decodes the slow way.
 */
export function decodePng(bytes: Uint8Array): DecodedPng | null {
	const png = readPngParts(bytes);
	if (!png) throw new Error('not a PNG file');
	const { width, height, depth, colour: type, palette, transparency, data } = png;
	if (png.interlace !== 0) return null;
	const samples = { 0: 1, 2: 3, 3: 1, 4: 2, 6: 4 }[type];
	if (!samples || !width || !height) throw new Error('unsupported PNG header');

	// Node's zlib (native) inflates and deflates pixels several times faster than a JS port.
	const raw = new Uint8Array(inflateSync(Buffer.concat(data)));
	const bitsPerPixel = samples * depth;
	const stride = Math.ceil((width * bitsPerPixel) / 8);
	const bpp = Math.max(1, bitsPerPixel >> 3);
	// The usual artwork (8-bit RGB or RGBA, as image editors and resvg write it): row by row, in one pass.
	if (depth === 8 && (type === 2 || type === 6) && !(type === 2 && transparency)) return decodeRgb8(raw, width, height, type === 6);
	const rows = unfilter(raw, stride, height, bpp);

	const isGrey = type === 0 || type === 4;
	const channels: 1 | 3 = isGrey ? 1 : 3;
	const colour = new Uint8Array(width * height * channels);
	const alpha = new Uint8Array(width * height);
	let opaque = true;
	const max = (1 << depth) - 1;
	const sample = (row: number, index: number): number => {
		// Sample `index` of a row, scaled to 8 bits (16-bit keeps its high byte).
		const base = row * stride;
		if (depth === 8) return rows[base + index];
		if (depth === 16) return rows[base + index * 2];
		const bit = index * depth;
		const v = (rows[base + (bit >> 3)] >> (8 - depth - (bit & 7))) & max;
		return v;
	};
	const rawSample = (row: number, index: number): number => {
		// Unscaled value, for palette indices and tRNS comparisons.
		const base = row * stride;
		if (depth === 16) return (rows[base + index * 2] << 8) | rows[base + index * 2 + 1];
		if (depth === 8) return rows[base + index];
		return sample(row, index);
	};
	const scale = depth < 8 ? 255 / max : 1;
	const keyGrey = transparency && type === 0 ? (transparency[0] << 8) | transparency[1] : -1;
	const keyRgb =
		transparency && type === 2
			? [0, 2, 4].map((o) => (transparency[o] << 8) | transparency[o + 1])
			: undefined;

	for (let y = 0; y < height; y++) {
		for (let x = 0; x < width; x++) {
			const p = y * width + x;
			let a = 255;
			if (type === 3) {
				const i = rawSample(y, x);
				if (!palette || i * 3 + 2 >= palette.length) throw new Error('PNG palette index out of range');
				colour[p * 3] = palette[i * 3];
				colour[p * 3 + 1] = palette[i * 3 + 1];
				colour[p * 3 + 2] = palette[i * 3 + 2];
				if (transparency && i < transparency.length) a = transparency[i];
			} else if (isGrey) {
				colour[p] = Math.round(sample(y, x * samples) * scale);
				if (type === 4) a = sample(y, x * 2 + 1);
				else if (rawSample(y, x) === keyGrey) a = 0;
			} else {
				for (let c = 0; c < 3; c++) colour[p * 3 + c] = sample(y, x * samples + c);
				if (type === 6) a = sample(y, x * 4 + 3);
				else if (
					keyRgb &&
					rawSample(y, x * 3) === keyRgb[0] &&
					rawSample(y, x * 3 + 1) === keyRgb[1] &&
					rawSample(y, x * 3 + 2) === keyRgb[2]
				)
					a = 0;
			}
			alpha[p] = a;
			if (a !== 255) opaque = false;
		}
	}
	return { widthPx: width, heightPx: height, channels, colour, alpha: opaque ? null : alpha };
}

/**
 * 8-bit RGB or RGBA: each row unfiltered into a small buffer and split into colour and alpha
 * straight away, so the whole picture is never held a second time.
 */
function decodeRgb8(raw: Uint8Array, width: number, height: number, hasAlpha: boolean): DecodedPng {
	const bpp = hasAlpha ? 4 : 3;
	const stride = width * bpp;
	const colour = new Uint8Array(width * height * 3);
	const alpha = hasAlpha ? new Uint8Array(width * height) : null;
	let prior = new Uint8Array(stride);
	let row = new Uint8Array(stride);
	let opaque = 255;
	for (let y = 0; y < height; y++) {
		unfilterRow(raw, y * (stride + 1), row, prior, y === 0, stride, bpp);
		if (!alpha) colour.set(row, y * stride);
		else {
			for (let x = 0, s = 0, c = y * width * 3, p = y * width; x < width; x++, s += 4, c += 3, p++) {
				colour[c] = row[s];
				colour[c + 1] = row[s + 1];
				colour[c + 2] = row[s + 2];
				const a = row[s + 3];
				alpha[p] = a;
				opaque &= a;
			}
		}
		[prior, row] = [row, prior];
	}
	return { widthPx: width, heightPx: height, channels: 3, colour, alpha: opaque === 255 ? null : alpha };
}

/** PNG scanline filters 0–4 (None, Sub, Up, Average, Paeth; PNG spec §9), undone into a new buffer. */
function unfilter(raw: Uint8Array, stride: number, height: number, bpp: number): Uint8Array {
	const out = new Uint8Array(stride * height);
	for (let y = 0; y < height; y++)
		unfilterRow(raw, y * (stride + 1), out.subarray(y * stride, (y + 1) * stride), y > 0 ? out.subarray((y - 1) * stride, y * stride) : out, y === 0, stride, bpp);
	return out;
}

/**
 * Undoes one row's filter: `raw[at]` is the filter type, the row's bytes follow; `prior` is the
 * row above, already unfiltered (ignored on the first row, where it counts as zeros). One loop
 * per filter type, since this runs for every byte of every picture.
 */
function unfilterRow(raw: Uint8Array, at: number, out: Uint8Array, prior: Uint8Array, first: boolean, stride: number, bpp: number): void {
	const filter = raw[at];
	const src = at + 1;
	switch (filter) {
		case 0:
			out.set(raw.subarray(src, src + stride));
			return;
		case 1:
			for (let i = 0; i < bpp; i++) out[i] = raw[src + i];
			for (let i = bpp; i < stride; i++) out[i] = raw[src + i] + out[i - bpp];
			return;
		case 2:
			if (first) out.set(raw.subarray(src, src + stride));
			else for (let i = 0; i < stride; i++) out[i] = raw[src + i] + prior[i];
			return;
		case 3:
			if (first) {
				for (let i = 0; i < bpp; i++) out[i] = raw[src + i];
				for (let i = bpp; i < stride; i++) out[i] = raw[src + i] + (out[i - bpp] >> 1);
			} else {
				for (let i = 0; i < bpp; i++) out[i] = raw[src + i] + (prior[i] >> 1);
				for (let i = bpp; i < stride; i++) out[i] = raw[src + i] + ((out[i - bpp] + prior[i]) >> 1);
			}
			return;
		case 4:
			if (first) {
				// No row above: Paeth picks the left neighbour (PNG spec §9.4).
				for (let i = 0; i < bpp; i++) out[i] = raw[src + i];
				for (let i = bpp; i < stride; i++) out[i] = raw[src + i] + out[i - bpp];
			} else {
				// At the row's start left and corner are 0, so Paeth picks the byte above.
				for (let i = 0; i < bpp; i++) out[i] = raw[src + i] + prior[i];
				for (let i = bpp; i < stride; i++) {
					const a = out[i - bpp];
					const b = prior[i];
					const c = prior[i - bpp];
					const p = a + b - c;
					const pa = p > a ? p - a : a - p;
					const pb = p > b ? p - b : b - p;
					const pc = p > c ? p - c : c - p;
					out[i] = raw[src + i] + (pa <= pb && pa <= pc ? a : pb <= pc ? b : c);
				}
			}
			return;
		default:
			throw new Error(`bad PNG filter ${filter}`);
	}
}

/** Interlaced PNGs are rare in artwork; they go through jimp, which is slower but complete. */
async function decodePngSlowly(bytes: Uint8Array): Promise<DecodedPng> {
	const image = await jimp().read(Buffer.from(bytes));
	const { width, height, data } = image.bitmap;
	const colour = new Uint8Array(width * height * 3);
	const alpha = new Uint8Array(width * height);
	let opaque = true;
	for (let p = 0; p < width * height; p++) {
		colour[p * 3] = data[p * 4];
		colour[p * 3 + 1] = data[p * 4 + 1];
		colour[p * 3 + 2] = data[p * 4 + 2];
		alpha[p] = data[p * 4 + 3];
		if (alpha[p] !== 255) opaque = false;
	}
	return { widthPx: width, heightPx: height, channels: 3, colour, alpha: opaque ? null : alpha };
}

/** Pixels compressed for a FlateDecode image object: what decoding and deflating a PNG costs, done once. */
export interface EncodedPixels {
	widthPx: number;
	heightPx: number;
	/** 1 grey, 3 RGB, 4 CMYK (converted for a press profile). */
	channels: 1 | 3 | 4;
	/** CMYK only: the highest total ink of any pixel, in % (C + M + Y + K). */
	maxInkPct?: number;
	/** zlib streams (ISO 32000-1 §7.4.4 FlateDecode) of the colour samples and of the alpha, if any. */
	colour: Uint8Array;
	alpha: Uint8Array | null;
	/**
	 * The streams hold PNG-filtered rows (each row led by its filter type), undone by the reader
	 * through the PNG predictors (ISO 32000-1 §7.4.4.4, Predictor 15); absent: plain samples.
	 */
	pngRows?: true;
}

/**
 * Keeps encoded pixels between documents (a bounded cache, say), so the same artwork is decoded
 * once per process rather than once per PDF. `key` names the asset's bytes (see `pixelKey`).
 */
export interface EncodedImageStore {
	get(key: string): EncodedPixels | undefined;
	set(key: string, pixels: EncodedPixels): void;
}

/** The store key of an asset: its id is a content hash; size and length guard against a reused id. */
export const pixelKey = (asset: ImageAsset) => `${asset.id}:${asset.widthPx}x${asset.heightPx}:${asset.bytes.length}`;

export function encodePixels(png: DecodedPng): EncodedPixels {
	return {
		widthPx: png.widthPx,
		heightPx: png.heightPx,
		channels: png.channels,
		colour: new Uint8Array(deflateSync(png.colour, { level: 6 })),
		alpha: png.alpha ? new Uint8Array(deflateSync(png.alpha, { level: 6 })) : null
	};
}

/** Writes encoded pixels as an image XObject (plus soft mask) and returns its ref. */
export function writeEncodedImage(doc: PDFDocument, pixels: EncodedPixels): PDFRef {
	const { context } = doc;
	const common = { Type: 'XObject', Subtype: 'Image', Width: pixels.widthPx, Height: pixels.heightPx, BitsPerComponent: 8 };
	const rows = (colors: number) => (pixels.pngRows ? { DecodeParms: { Predictor: 15, Colors: colors, BitsPerComponent: 8, Columns: pixels.widthPx } } : {});
	let smask: PDFRef | undefined;
	if (pixels.alpha) {
		smask = context.register(context.stream(pixels.alpha, { ...common, ColorSpace: 'DeviceGray', Filter: 'FlateDecode', ...rows(1) }));
	}
	return context.register(
		context.stream(pixels.colour, {
			...common,
			ColorSpace: pixels.channels === 1 ? 'DeviceGray' : pixels.channels === 4 ? 'DeviceCMYK' : 'DeviceRGB',
			Filter: 'FlateDecode',
			...rows(pixels.channels),
			...(smask ? { SMask: smask } : {})
		})
	);
}

/**
 * An 8-bit, non-interlaced grey or RGB PNG (with or without alpha, no tRNS key colour) as image
 * streams whose rows keep the PNG's own filters, for the reader to undo (PNG predictors, ISO
 * 32000-1 §7.4.4.4): the rows are never unfiltered here. Without alpha the PNG's zlib stream goes
 * in as it is. With alpha each filtered row is split into its colour and alpha bytes: a PNG
 * filter predicts every byte from the same channel of the pixel to the left and above (PNG spec
 * §9.2, bytes `bpp` apart), so the colour bytes with the row's filter type are that row filtered
 * as colour alone, and the alpha bytes likewise. Only the alpha is unfiltered (one byte a pixel),
 * to leave out a mask that is opaque everywhere. Null for any other PNG (decode it instead).
 *
 * Two steps, so a caller can run the second on libuv's threads: the rows split (`split`), then
 * compressed (`compress`), each with Node's zlib, sync or async.
 */
interface SplitRows {
	head: Omit<EncodedPixels, 'colour' | 'alpha'>;
	/** The colour rows: compressed already (the PNG's own stream), or to compress. */
	colour: { zlib: Uint8Array } | { rows: Uint8Array };
	alphaRows: Uint8Array | null;
}

async function splitPngRows(bytes: Uint8Array, inflate: (b: Uint8Array) => Uint8Array | Promise<Uint8Array>): Promise<SplitRows | null> {
	const png = readPngParts(bytes);
	if (!png || !png.width || !png.height || !png.data.length || png.depth !== 8 || png.interlace !== 0 || png.transparency || png.palette) return null;
	const channels: 1 | 3 | undefined = png.colour === 0 || png.colour === 4 ? 1 : png.colour === 2 || png.colour === 6 ? 3 : undefined;
	if (!channels) return null;
	const { width, height } = png;
	const head = { widthPx: width, heightPx: height, channels, pngRows: true as const };
	const stream = Buffer.concat(png.data);
	// Inflated even when it goes in as it is: a damaged stream is refused here, not left to the reader.
	const raw = await inflate(stream);
	const bpp = png.colour === 0 || png.colour === 2 ? channels : channels + 1;
	const stride = width * bpp;
	if (raw.length < height * (stride + 1)) throw new Error('PNG image data is too short');
	for (let y = 0; y < height; y++) if (raw[y * (stride + 1)] > 4) throw new Error(`bad PNG filter ${raw[y * (stride + 1)]}`);
	if (png.colour === 0 || png.colour === 2) return { head, colour: { zlib: stream }, alphaRows: null };

	const colour = new Uint8Array(height * (width * channels + 1));
	const alphaRows = new Uint8Array(height * (width + 1));
	for (let y = 0, r = 0, c = 0, a = 0; y < height; y++) {
		colour[c++] = alphaRows[a++] = raw[r++];
		if (channels === 3)
			for (let x = 0; x < width; x++, r += 4, c += 3) {
				colour[c] = raw[r];
				colour[c + 1] = raw[r + 1];
				colour[c + 2] = raw[r + 2];
				alphaRows[a++] = raw[r + 3];
			}
		else for (let x = 0; x < width; x++, r += 2) (colour[c++] = raw[r]), (alphaRows[a++] = raw[r + 1]);
	}
	// Opaque everywhere? Unfiltered a row at a time; the first see-through pixel settles it.
	let opaque = true;
	let prior = new Uint8Array(width);
	let row = new Uint8Array(width);
	for (let y = 0; y < height && opaque; y++) {
		unfilterRow(alphaRows, y * (width + 1), row, prior, y === 0, width, 1);
		for (let x = 0; x < width; x++) if (row[x] !== 255) opaque = false;
		[prior, row] = [row, prior];
	}
	return { head, colour: { rows: colour }, alphaRows: opaque ? null : alphaRows };
}

async function compressRows(split: SplitRows, deflate: (b: Uint8Array) => Uint8Array | Promise<Uint8Array>): Promise<EncodedPixels> {
	const [colour, alpha] = await Promise.all([
		'zlib' in split.colour ? split.colour.zlib : deflate(split.colour.rows),
		split.alphaRows ? deflate(split.alphaRows) : null
	]);
	return { ...split.head, colour, alpha };
}

// Inflated rows are read once and dropped: no copy out of the Buffer.
const syncZlib = { inflate: (b: Uint8Array): Uint8Array => inflateSync(b), deflate: (b: Uint8Array) => new Uint8Array(deflateSync(b, { level: 6 })) };
const deflateAsync = promisify(deflate);
const asyncZlib = { deflate: async (b: Uint8Array) => new Uint8Array(await deflateAsync(b, { level: 6 })) };

/** A PNG asset's pixels for a plain (not press) document: its rows as they are where it can, else decoded. */
async function encodePngAsset(asset: ImageAsset): Promise<EncodedPixels> {
	const split = await splitPngRows(asset.bytes, syncZlib.inflate);
	if (split) return compressRows(split, syncZlib.deflate);
	return encodePixels(decodePng(asset.bytes) ?? (await decodePngSlowly(asset.bytes)));
}

/**
 * Starts encoding the PNG pictures the store does not hold yet. Resolves once their rows are
 * split (the part on this thread), with `compressed`, which resolves when the compression, on
 * libuv's threads meanwhile, is done and the store holds them: a caller lays out faces in
 * between (await this first, so the compression starts before the layout does) and finds the
 * pictures ready when it draws. Pictures that need decoding, or fail, are
 * left to the document (which reports a damaged one where it draws it).
 */
export async function encodeImagesAhead(assets: Iterable<ImageAsset>, store: EncodedImageStore): Promise<{ compressed: Promise<void> }> {
	const todo = [...assets].filter((a) => a.mime === 'image/png' && !store.get(pixelKey(a)));
	// Inflated here and now (native, quick): an inflate on libuv's threads would only come back
	// once this thread is idle, after the layout it was meant to run beside.
	const split = await Promise.all(todo.map((asset) => splitPngRows(asset.bytes, syncZlib.inflate).catch(() => null)));
	const compressed = Promise.all(
		split.map(async (rows, i) => {
			if (!rows) return;
			try {
				store.set(pixelKey(todo[i]), await compressRows(rows, asyncZlib.deflate));
			} catch {
				// Left to the document.
			}
		})
	).then(() => undefined);
	return { compressed };
}

/** Writes decoded pixels as a FlateDecode image XObject (plus soft mask) and returns its ref. */
export function writePixelImage(doc: PDFDocument, png: DecodedPng): PDFRef {
	return writeEncodedImage(doc, encodePixels(png));
}

/** What a press document asks of its images: CMYK through the profile, and the limits of its standard. */
export interface PressImages {
	colour: PressColour;
	/** PDF/X-1a carries no transparency (ISO 15930-4): a picture with an alpha channel is refused. */
	allowTransparency: boolean;
	/** Told of each image's highest total ink, in %. */
	onInk?: (imageId: string, maxInkPct: number) => void;
}

/** A picture that a press standard cannot carry as it is; the message says what to do. */
export class PressImageError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'PressImageError';
	}
}

/** Decoded pixels of any accepted asset: PNG by our decoder, JPEG (and interlaced PNG) through jimp. */
async function decodeAsset(asset: ImageAsset): Promise<DecodedPng> {
	if (asset.mime === 'image/png') return decodePng(asset.bytes) ?? (await decodePngSlowly(asset.bytes));
	return decodePngSlowly(asset.bytes);
}

/**
 * Pixels converted to the press profile's CMYK (grey stays grey: it prints on the black plate),
 * kept in the store under the art's hash, the profile and the intent.
 */
export async function pressPixels(asset: ImageAsset, press: PressColour, store?: EncodedImageStore): Promise<EncodedPixels> {
	const key = `${pixelKey(asset)}|press:${press.profileKey}:${press.intent}`;
	const kept = store?.get(key);
	if (kept) return kept;
	const png = await decodeAsset(asset);
	let encoded: EncodedPixels;
	if (png.channels === 3) {
		const cmyk = press.pixelsToCmyk(png.colour);
		let max = 0;
		for (let i = 0; i < cmyk.length; i += 4) {
			const sum = cmyk[i] + cmyk[i + 1] + cmyk[i + 2] + cmyk[i + 3];
			if (sum > max) max = sum;
		}
		encoded = { ...encodePixels({ ...png, colour: cmyk, channels: 3 }), channels: 4, maxInkPct: Math.round((max / 255) * 1000) / 10 };
	} else encoded = encodePixels(png);
	store?.set(key, encoded);
	return encoded;
}

/**
 * One document's images: each asset is embedded on first use and its ref reused after that;
 * each page names it once in its resources however often it is drawn there.
 */
export class PdfImageCache {
	private refs = new Map<string, Promise<PDFRef>>();
	private pageNames = new WeakMap<object, Map<string, PDFName>>();
	/** How many image objects were written (for tests: once per asset per document). */
	embedded = 0;

	constructor(
		private doc: PDFDocument,
		private assets: ReadonlyMap<string, ImageAsset>,
		/** Encoded pixels shared with other documents (optional). */
		private store?: EncodedImageStore,
		/** Press output: every picture converted to the profile's CMYK. */
		private press?: PressImages
	) {}

	ref(imageId: string): Promise<PDFRef> {
		let ref = this.refs.get(imageId);
		if (!ref) {
			ref = this.embed(imageId);
			this.refs.set(imageId, ref);
		}
		return ref;
	}

	/** The resource name of the image on this page, adding it to the page once. */
	async nameOn(page: { node: { newXObject(tag: string, ref: PDFRef): PDFName } }, imageId: string): Promise<PDFName> {
		let names = this.pageNames.get(page);
		if (!names) this.pageNames.set(page, (names = new Map()));
		const known = names.get(imageId);
		if (known) return known;
		const name = page.node.newXObject('Im', await this.ref(imageId));
		names.set(imageId, name);
		return name;
	}

	private async embed(imageId: string): Promise<PDFRef> {
		const asset = this.assets.get(imageId);
		if (!asset) throw new Error(`image ${imageId} is not in the image table`);
		this.embedded++;
		if (this.press) {
			const pixels = await pressPixels(asset, this.press.colour, this.store);
			if (pixels.alpha && !this.press.allowTransparency)
				throw new PressImageError(`a picture (${asset.id.slice(0, 12)}) has transparent pixels, which PDF/X-1a cannot carry: choose PDF/X-4`);
			if (pixels.maxInkPct !== undefined) this.press.onInk?.(imageId, pixels.maxInkPct);
			return writeEncodedImage(this.doc, pixels);
		}
		if (asset.mime === 'image/jpeg') return (await this.doc.embedJpg(asset.bytes)).ref;
		const key = pixelKey(asset);
		let pixels = this.store?.get(key);
		if (!pixels) {
			pixels = await encodePngAsset(asset);
			this.store?.set(key, pixels);
		}
		return writeEncodedImage(this.doc, pixels);
	}
}
