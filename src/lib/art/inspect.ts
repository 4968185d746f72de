/**
 * Artwork inspection: what the upload route runs on every file before it is stored.
 *
 * Order matters, cheapest and safest first: size cap, real type from the first bytes (never the
 * name or the declared content type), pixel cap from the header, and only then any decode. SVGs
 * are refused when they could run, reach outside the file or blow up when drawn (./svg-safety.ts).
 * The result carries what the game keeps about the art (an ArtAsset without its id and status)
 * and a small PNG thumbnail.
 */
import { createHash } from 'node:crypto';
import { imageSize } from 'image-size';
import pLimit from 'p-limit';
import { MM_PER_INCH, type ArtMime } from '../game/model';
import { jimp } from '../print/jimp';
import { rgbaToPng, svgToPng } from '../print/png';
import { jpegDeclaredDpi, pngDeclaredDpi, type DeclaredDpi } from './declared-dpi';
import { isPng } from './png-chunks';
import { ArtRejected } from './rejected';
import { checkSvg } from './svg-safety';
import { pngIsInterlaced, pngStripThumbnail, PngStripError } from './png-strips';

export { ArtRejected, type ArtRejectionReason } from './rejected';

/** 25 MiB: our own cap, above any card-sized art at print resolution. */
export const MAX_ART_BYTES = 25 * 1024 * 1024;
/** 100 megapixels: our own cap; decoded RGBA that large is already 400 MB of memory. */
export const MAX_ART_PIXELS = 100_000_000;
/**
 * 25 megapixels: the most a JPEG or an interlaced PNG may have, since those are decoded whole
 * (about 100 MB of RGBA, several times that while decoding). Our own cap, above A3 at 300 dpi
 * (3508 × 4961 px, ISO 216 sizes). Other PNGs are read in strips up to MAX_ART_PIXELS.
 */
export const MAX_WHOLE_DECODE_PIXELS = 25_000_000;

/**
 * How many pictures are decoded at once in this process: whole decodes one at a time, strip
 * reads two (each holds a few rows). Others wait their turn rather than add to memory.
 */
const wholeDecodes = pLimit(1);
const stripReads = pLimit(2);

/** Thumbnails fit in a 320 × 320 px box (our own choice, enough for lists and slot pickers). */
export const THUMBNAIL_MAX_PX = 320;

/** CSS px per inch (CSS Values and Units Level 3 §6.2): the SVG thumbnail's render scale. */
const CSS_PX_PER_INCH = 96;

export interface ArtLimits {
	maxBytes?: number;
	maxPixels?: number;
}

export interface ArtThumbnail {
	mime: 'image/png';
	bytes: Uint8Array;
	widthPx: number;
	heightPx: number;
}

export interface InspectedArt {
	mime: ArtMime;
	/** As the picture is seen: a JPEG's EXIF orientation 5–8 swaps its stored width and height. */
	widthPx: number;
	heightPx: number;
	/** Declared by the file (PNG pHYs, JPEG EXIF/JFIF); absent for SVG or when not declared. */
	dpiX?: number;
	dpiY?: number;
	/**
	 * EXIF orientation 2–8 when the JPEG's pixels are stored turned or mirrored (Exif 2.32
	 * tag 0x0112); whoever places the raw JPEG must turn it. Absent when upright.
	 */
	exifOrientation?: number;
	/** Hex SHA-256 of `bytes`: the content address to store them under. */
	sha256: string;
	/** The bytes to store. SVGs are refused rather than rewritten, so these are the upload's own. */
	bytes: Uint8Array;
	thumbnail: ArtThumbnail;
}

const MIB = 1024 * 1024;

/** Inspect an uploaded art file; throws ArtRejected with a message for the person uploading. */
export async function inspectArt(bytes: Uint8Array, fileName: string, limits: ArtLimits = {}): Promise<InspectedArt> {
	const maxBytes = limits.maxBytes ?? MAX_ART_BYTES;
	const maxPixels = limits.maxPixels ?? MAX_ART_PIXELS;

	if (bytes.byteLength > maxBytes)
		throw new ArtRejected(
			'too-large',
			`This file is ${Math.ceil((bytes.byteLength / MIB) * 10) / 10} MB; ` +
				`Paddock accepts art files up to ${+(maxBytes / MIB).toFixed(1)} MB.`
		);

	const mime = sniffArt(bytes);
	if (!mime) throw notAnImageError(bytes, fileName);
	const inspected =
		mime === 'image/svg+xml' ? await inspectSvg(bytes, maxPixels) : await inspectRaster(bytes, mime, maxPixels);
	return { ...inspected, sha256: createHash('sha256').update(bytes).digest('hex'), bytes };
}

/**
 * The type from the first bytes: PNG signature (ISO/IEC 15948:2004 §5.2), JPEG SOI marker and
 * the next marker's FF (ITU-T T.81 Annex B), else UTF-8 text whose first character after an
 * optional BOM and white space is `<` — an SVG candidate, confirmed by its <svg> root.
 */
export function sniffArt(bytes: Uint8Array): ArtMime | undefined {
	if (isPng(bytes)) return 'image/png';
	if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'image/jpeg';
	let at = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
	while (at < bytes.length && (bytes[at] === 0x20 || bytes[at] === 0x09 || bytes[at] === 0x0a || bytes[at] === 0x0d))
		at++;
	return bytes[at] === 0x3c ? 'image/svg+xml' : undefined;
}

async function inspectRaster(
	bytes: Uint8Array,
	mime: 'image/png' | 'image/jpeg',
	maxPixels: number
): Promise<Omit<InspectedArt, 'sha256' | 'bytes'>> {
	// The header alone: nothing is decoded until the pixel cap has passed.
	let header: { width: number; height: number; orientation?: number; type?: string };
	try {
		header = imageSize(bytes);
	} catch {
		throw new ArtRejected('no-size', `This ${label(mime)} has no readable width and height; the file may be damaged.`);
	}
	const { width, height } = header;
	if (!(width > 0) || !(height > 0))
		throw new ArtRejected('no-size', `This ${label(mime)} says it is ${width} × ${height} px, which cannot be a picture.`);
	if (width * height > maxPixels)
		throw new ArtRejected(
			'too-many-pixels',
			`This ${label(mime)} is ${width} × ${height} px (${megapixels(width * height)}); Paddock accepts up to ` +
				`${megapixels(maxPixels)}. Scale it down and upload it again.`
		);

	const declared: DeclaredDpi | undefined = mime === 'image/png' ? pngDeclaredDpi(bytes) : await jpegDeclaredDpi(bytes);
	const orientation =
		mime === 'image/jpeg' && header.orientation && header.orientation !== 1 ? header.orientation : undefined;
	// Exif 2.32 Orientation 5–8 are a quarter turn (with or without a mirror): width and height swap.
	const turned = orientation !== undefined && orientation >= 5 && orientation <= 8;

	const thumbnail =
		mime === 'image/png' && !pngIsInterlaced(bytes)
			? await stripReads(() => pngThumbnail(bytes, width, height))
			: await wholeDecodes(() => wholeThumbnail(bytes, mime, width, height, maxPixels));

	return {
		mime,
		widthPx: turned ? height : width,
		heightPx: turned ? width : height,
		...(declared && (turned ? { dpiX: declared.dpiY, dpiY: declared.dpiX } : declared)),
		...(orientation !== undefined && { exifOrientation: orientation }),
		thumbnail
	};
}

/** A PNG read in strips: decoded fully (every row checked) without holding the picture. */
async function pngThumbnail(bytes: Uint8Array, width: number, height: number): Promise<ArtThumbnail> {
	const box = fitBox(width, height);
	let strips: Awaited<ReturnType<typeof pngStripThumbnail>>;
	try {
		strips = await pngStripThumbnail(bytes, box.widthPx, box.heightPx);
	} catch (error) {
		if (!(error instanceof PngStripError)) throw error;
		throw new ArtRejected('unreadable', `This PNG could not be decoded (${error.message}); the file may be damaged.`);
	}
	return { mime: 'image/png', bytes: rgbaToPng(strips.rgba, box.widthPx, box.heightPx), widthPx: box.widthPx, heightPx: box.heightPx };
}

/** JPEGs and interlaced PNGs: decoded whole, so under a lower pixel cap and one at a time. */
async function wholeThumbnail(
	bytes: Uint8Array,
	mime: 'image/png' | 'image/jpeg',
	width: number,
	height: number,
	maxPixels: number
): Promise<ArtThumbnail> {
	const cap = Math.min(maxPixels, MAX_WHOLE_DECODE_PIXELS);
	if (width * height > cap)
		throw new ArtRejected(
			'too-many-pixels',
			`This ${mime === 'image/png' ? 'interlaced PNG' : 'JPEG'} is ${width} × ${height} px (${megapixels(width * height)}); ` +
				`Paddock accepts up to ${megapixels(cap)} for this kind of file. Scale it down, or save it as a non-interlaced PNG.`
		);
	let image: Awaited<ReturnType<ReturnType<typeof jimp>['read']>>;
	try {
		image = await jimp().read(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength), {
			'image/jpeg': { maxResolutionInMP: cap / 1e6, maxMemoryUsageInMB: jpegMemoryMb(cap) }
		});
	} catch (error) {
		throw new ArtRejected(
			'unreadable',
			`This ${label(mime)} could not be decoded (${(error as Error).message}); ` +
				'the file may be damaged or use a feature Paddock cannot read.'
		);
	}
	// Jimp turns JPEGs upright from their EXIF orientation, so the thumbnail is as the picture is seen.
	const box = fitBox(image.width, image.height);
	if (box.widthPx !== image.width || box.heightPx !== image.height) image.resize({ w: box.widthPx, h: box.heightPx });
	const png = await image.getBuffer('image/png');
	return { mime: 'image/png', bytes: new Uint8Array(png), widthPx: image.width, heightPx: image.height };
}

async function inspectSvg(bytes: Uint8Array, maxPixels: number): Promise<Omit<InspectedArt, 'sha256' | 'bytes'>> {
	let text: string;
	try {
		text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
	} catch {
		throw new ArtRejected(
			'not-an-image',
			'This file is not a PNG, JPEG or SVG image (it starts like markup, but is not UTF-8 text as an SVG file must be).'
		);
	}
	const facts = checkSvg(text, { maxPixels });
	// resvg fits the width and derives the height; rounding down keeps a tall picture within the box.
	const { widthPx, heightPx } = facts;
	const thumbWidthPx =
		widthPx >= heightPx ? THUMBNAIL_MAX_PX : Math.max(1, Math.floor((THUMBNAIL_MAX_PX * widthPx) / heightPx));
	let rendered: Awaited<ReturnType<typeof svgToPng>>;
	try {
		// The print engine's renderer: resvg initialised once per process, shipped fonts only.
		rendered = await svgToPng(text, { widthMm: (thumbWidthPx / CSS_PX_PER_INCH) * MM_PER_INCH, dpi: CSS_PX_PER_INCH });
	} catch (error) {
		throw new ArtRejected('unreadable', `This SVG could not be drawn (${(error as Error).message}).`);
	}
	return {
		mime: 'image/svg+xml',
		widthPx: facts.widthPx,
		heightPx: facts.heightPx,
		thumbnail: { mime: 'image/png', bytes: rendered.png, widthPx: rendered.widthPx, heightPx: rendered.heightPx }
	};
}

/** A bitmap thumbnail's size: long side at most THUMBNAIL_MAX_PX, never enlarged. */
function fitBox(widthPx: number, heightPx: number): { widthPx: number; heightPx: number } {
	const long = Math.max(widthPx, heightPx);
	const scale = long > THUMBNAIL_MAX_PX ? THUMBNAIL_MAX_PX / long : 1;
	return { widthPx: Math.max(1, Math.round(widthPx * scale)), heightPx: Math.max(1, Math.round(heightPx * scale)) };
}

/**
 * jpeg-js refuses to allocate more than a set amount; its default (512 MB) would refuse JPEGs
 * well under our pixel cap. Its own accounting for three full-resolution components (4:4:4) is
 * 12 bytes of coefficient blocks, 3 of component lines and 4 of RGBA output per pixel: 20 with
 * room to spare, plus headroom for tables. Subsampled JPEGs need less.
 */
const jpegMemoryMb = (maxPixels: number) => Math.ceil((maxPixels * 20) / MIB) + 64;

const label = (mime: ArtMime) => (mime === 'image/png' ? 'PNG' : mime === 'image/jpeg' ? 'JPEG' : 'SVG');

const megapixels = (px: number) => `${(px / 1e6).toFixed(px < 1e7 ? 1 : 0)} megapixels`;

/** Names people know for files often sent by mistake (detected by image-size, or `%PDF-`). */
const OTHER_KINDS: Record<string, string> = {
	gif: 'a GIF image',
	webp: 'a WebP image',
	tiff: 'a TIFF image',
	bmp: 'a BMP image',
	heif: 'a HEIC/HEIF/AVIF image',
	psd: 'a Photoshop (PSD) file',
	jp2: 'a JPEG 2000 image',
	jxl: 'a JPEG XL image',
	ico: 'an icon file',
	tga: 'a TGA image'
};

function notAnImageError(bytes: Uint8Array, fileName: string): ArtRejected {
	let kind: string | undefined;
	if (String.fromCharCode(...bytes.subarray(0, 5)) === '%PDF-') kind = 'a PDF document';
	else {
		try {
			const type = imageSize(bytes).type;
			kind = type ? OTHER_KINDS[type] : undefined;
		} catch {
			kind = undefined;
		}
	}
	const name = displayName(fileName);
	return new ArtRejected(
		'not-an-image',
		`This file is not a PNG, JPEG or SVG image: ${name} ${kind ? `is ${kind}` : 'holds something else'}, ` +
			'whatever its name says. ' +
			'Save the art as PNG, JPEG or SVG and upload it again.'
	);
}

/** The uploaded name, for messages: no control characters, not endlessly long. */
function displayName(fileName: string): string {
	const clean = fileName.replace(/[\u0000-\u001f\u007f]/g, '').trim();
	if (!clean) return 'the file';
	return `“${clean.length > 80 ? clean.slice(0, 77) + '…' : clean}”`;
}
