import { execFileSync } from 'node:child_process';
import { crc32 } from 'node:zlib';
import { imageSize } from 'image-size';
import { Jimp } from 'jimp';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { checkArtResolution, faceWithBleedMm } from '../game/art-check';
import { ArtRejected, inspectArt, MAX_ART_BYTES, THUMBNAIL_MAX_PX } from './inspect';

/* ------------------------------------------------------------- fixtures */

const concat = (...parts: Uint8Array[]) => new Uint8Array(Buffer.concat(parts));
const u32be = (n: number) => new Uint8Array([n >>> 24, (n >>> 16) & 255, (n >>> 8) & 255, n & 255]);
const ascii = (s: string) => new Uint8Array([...s].map((c) => c.charCodeAt(0)));

/** PNG spec (ISO/IEC 15948:2004) §5.2 signature; §5.3 chunk = length, type, data, CRC-32 of type + data. */
const PNG_SIG = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
const pngChunk = (type: string, data: Uint8Array) =>
	concat(u32be(data.length), ascii(type), data, u32be(crc32(concat(ascii(type), data))));

/** A PNG of just a signature, an IHDR (§11.2.2: width, height, depth 8, colour type 6 RGBA) and IEND. */
const pngHeaderOnly = (widthPx: number, heightPx: number) =>
	concat(
		PNG_SIG,
		pngChunk('IHDR', concat(u32be(widthPx), u32be(heightPx), new Uint8Array([8, 6, 0, 0, 0]))),
		pngChunk('IEND', new Uint8Array())
	);

/** Insert a pHYs chunk (§11.3.5.3) right after IHDR, which ends at byte 8 + 25 = 33. */
const withPhys = (png: Uint8Array, ppuX: number, ppuY: number, unit: number) =>
	concat(png.subarray(0, 33), pngChunk('pHYs', concat(u32be(ppuX), u32be(ppuY), new Uint8Array([unit]))), png.subarray(33));

async function solidPng(widthPx: number, heightPx: number, rgba = 0x3366ccff) {
	return new Uint8Array(await new Jimp({ width: widthPx, height: heightPx, color: rgba }).getBuffer('image/png'));
}

/** A JPEG from jimp; its APP0 JFIF segment starts at byte 2 (JFIF 1.02: SOI, then APP0). */
async function solidJpeg(widthPx: number, heightPx: number) {
	const jpeg = new Uint8Array(await new Jimp({ width: widthPx, height: heightPx, color: 0xcc3333ff }).getBuffer('image/jpeg'));
	expect(String.fromCharCode(...jpeg.subarray(6, 11))).toBe('JFIF\0');
	return jpeg;
}

/** JFIF 1.02 APP0 after the identifier: version (2), units (1), Xdensity (2), Ydensity (2). */
function setJfifDensity(jpeg: Uint8Array, units: number, x: number, y: number) {
	const out = jpeg.slice();
	out[13] = units;
	out[14] = x >> 8;
	out[15] = x & 255;
	out[16] = y >> 8;
	out[17] = y & 255;
	return out;
}

/**
 * An Exif APP1 segment (Exif 2.32 §4.5.4: "Exif\0\0" then a TIFF header) with IFD0 holding
 * XResolution and YResolution (RATIONAL, TIFF 6.0 type 5), ResolutionUnit and, optionally,
 * Orientation (SHORT, type 3), little-endian ("II", TIFF 6.0 §2), inserted after APP0.
 */
function withExif(jpeg: Uint8Array, res: { num: number; den: number; unit: number }, orientation?: number) {
	const entries: [tag: number, type: number, value: number][] = [];
	if (orientation) entries.push([0x0112, 3, orientation]);
	entries.push([0x011a, 5, 0], [0x011b, 5, 0], [0x0128, 3, res.unit]);
	const ifdAt = 8;
	const rationalsAt = ifdAt + 2 + entries.length * 12 + 4;
	const tiff = new DataView(new ArrayBuffer(rationalsAt + 16));
	tiff.setUint16(0, 0x4949);
	tiff.setUint16(2, 42, true);
	tiff.setUint32(4, ifdAt, true);
	tiff.setUint16(ifdAt, entries.length, true);
	let rational = rationalsAt;
	entries.forEach(([tag, type, value], i) => {
		const at = ifdAt + 2 + i * 12;
		tiff.setUint16(at, tag, true);
		tiff.setUint16(at + 2, type, true);
		tiff.setUint32(at + 4, 1, true);
		if (type === 5) {
			tiff.setUint32(at + 8, rational, true);
			tiff.setUint32(rational, res.num, true);
			tiff.setUint32(rational + 4, res.den, true);
			rational += 8;
		} else tiff.setUint16(at + 8, value, true);
	});
	const body = concat(ascii('Exif\0\0'), new Uint8Array(tiff.buffer));
	const app1 = concat(new Uint8Array([0xff, 0xe1, (body.length + 2) >> 8, (body.length + 2) & 255]), body);
	const app0End = 4 + ((jpeg[4] << 8) | jpeg[5]);
	return concat(jpeg.subarray(0, app0End), app1, jpeg.subarray(app0End));
}

const svg = (body: string, attrs = 'width="100" height="50"') =>
	new TextEncoder().encode(`<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" ${attrs}>${body}</svg>`);

const base64 = (bytes: Uint8Array) => Buffer.from(bytes).toString('base64');

async function rejection(promise: Promise<unknown>): Promise<ArtRejected> {
	try {
		await promise;
	} catch (error) {
		expect(error).toBeInstanceOf(ArtRejected);
		return error as ArtRejected;
	}
	throw new Error('expected the art to be refused');
}

afterEach(() => vi.restoreAllMocks());

/* ---------------------------------------------------------------- PNG */

describe('PNG', () => {
	it('reports 300 dpi from a pHYs chunk of 11811 px/m', async () => {
		// PNG spec §11.3.5.3: unit 1 = metre; 11811 px/m × 0.0254 m/in = 299.9994 dpi.
		const png = withPhys(await solidPng(60, 40), 11811, 11811, 1);
		const art = await inspectArt(png, 'tile.png');
		expect(art.mime).toBe('image/png');
		expect([art.widthPx, art.heightPx]).toEqual([60, 40]);
		expect(art.dpiX).toBeCloseTo(300, 2);
		expect(art.dpiY).toBeCloseTo(300, 2);
	});

	it('leaves the dpi undefined without pHYs, or when its unit is unknown', async () => {
		// PNG spec §11.3.5.3: unit 0 gives only the pixel aspect ratio.
		const plain = await inspectArt(await solidPng(20, 20), 'a.png');
		expect(plain.dpiX).toBeUndefined();
		const aspectOnly = await inspectArt(withPhys(await solidPng(20, 20), 1, 1, 0), 'b.png');
		expect(aspectOnly.dpiX).toBeUndefined();
		expect(aspectOnly.dpiY).toBeUndefined();
	});

	it('refuses a header claiming 30000 × 30000 without decoding it', async () => {
		const read = vi.spyOn(Jimp, 'read');
		const error = await rejection(inspectArt(pngHeaderOnly(30000, 30000), 'huge.png'));
		expect(error.status).toBe(400);
		expect(error.reason).toBe('too-many-pixels');
		expect(error.message).toContain('30000 × 30000');
		expect(error.message).toContain('megapixels');
		expect(read).not.toHaveBeenCalled();
	});

	it('refuses zero width', async () => {
		const error = await rejection(inspectArt(pngHeaderOnly(0, 10), 'flat.png'));
		expect(error.reason).toBe('no-size');
		expect(error.status).toBe(400);
	});

	it('refuses a PNG signature with nothing readable behind it', async () => {
		const error = await rejection(inspectArt(concat(PNG_SIG, ascii('garbage')), 'broken.png'));
		expect(error.status).toBe(400);
	});

	it('makes a thumbnail at most 320 px on the long side, and never enlarges', async () => {
		const big = await inspectArt(await solidPng(800, 400), 'wide.png');
		expect([big.thumbnail.widthPx, big.thumbnail.heightPx]).toEqual([THUMBNAIL_MAX_PX, 160]);
		// image-size as an independent reader of the thumbnail it is handed.
		expect(imageSize(big.thumbnail.bytes)).toMatchObject({ type: 'png', width: 320, height: 160 });
		const small = await inspectArt(await solidPng(30, 90), 'tall.png');
		expect([small.thumbnail.widthPx, small.thumbnail.heightPx]).toEqual([30, 90]);
	});

	it('gives poker art with 1/8 in bleed at 825 × 1125 px straight to the art check', async () => {
		// Product brief: poker 63.5 × 88.9 mm + 1/8 in bleed at 300 dpi is 825 × 1125 px.
		const art = await inspectArt(withPhys(await solidPng(825, 1125), 11811, 11811, 1), 'face.png');
		const check = checkArtResolution(art, faceWithBleedMm({ widthMm: 63.5, heightMm: 88.9 }, 'us'));
		expect(check.ok).toBe(true);
		expect(check.dpi).toBeCloseTo(300, 6);
	});

	it('addresses the stored bytes by their SHA-256', async () => {
		const png = await solidPng(10, 10);
		const art = await inspectArt(png, 'a.png');
		// coreutils sha256sum (FIPS 180-4) as the independent reader.
		const expected = execFileSync('sha256sum', { input: Buffer.from(png) }).toString().split(' ')[0];
		expect(art.sha256).toBe(expected);
		expect(art.bytes).toEqual(png);
	});
});

/* --------------------------------------------------------------- JPEG */

describe('JPEG', () => {
	it('reports 150 dpi from a JFIF density of 150 dots per inch', async () => {
		// JFIF 1.02: units 1 = dots per inch.
		const jpeg = setJfifDensity(await solidJpeg(50, 30), 1, 150, 150);
		const art = await inspectArt(jpeg, 'runner.jpg');
		expect(art.mime).toBe('image/jpeg');
		expect([art.widthPx, art.heightPx]).toEqual([50, 30]);
		expect(art.dpiX).toBeCloseTo(150, 6);
		expect(art.dpiY).toBeCloseTo(150, 6);
		expect(art.thumbnail.mime).toBe('image/png');
	});

	it('converts JFIF dots per cm and ignores an aspect-ratio-only density', async () => {
		// JFIF 1.02: units 2 = dots per cm (× 2.54 for inches); units 0 = aspect ratio only.
		const perCm = await inspectArt(setJfifDensity(await solidJpeg(20, 20), 2, 118, 118), 'cm.jpg');
		expect(perCm.dpiX).toBeCloseTo(299.72, 6);
		const aspect = await inspectArt(setJfifDensity(await solidJpeg(20, 20), 0, 1, 1), 'aspect.jpg');
		expect(aspect.dpiX).toBeUndefined();
	});

	it('reads the EXIF resolution in pixels per cm, which wins over JFIF', async () => {
		// TIFF 6.0 §8 ResolutionUnit: 3 = centimetre; 118.11 px/cm × 2.54 = 299.9994 dpi.
		const jpeg = withExif(setJfifDensity(await solidJpeg(40, 20), 1, 72, 72), { num: 11811, den: 100, unit: 3 });
		const art = await inspectArt(jpeg, 'exif.jpg');
		expect(art.dpiX).toBeCloseTo(300, 2);
		expect(art.dpiY).toBeCloseTo(300, 2);
	});

	it('reports a quarter-turned JPEG as it is seen', async () => {
		// Exif 2.32 §4.6.4 Orientation 6: stored pixels are turned a quarter; seen 20 × 40, not 40 × 20.
		const jpeg = withExif(await solidJpeg(40, 20), { num: 300, den: 1, unit: 2 }, 6);
		const art = await inspectArt(jpeg, 'turned.jpg');
		expect([art.widthPx, art.heightPx]).toEqual([20, 40]);
		expect(art.exifOrientation).toBe(6);
		expect([art.thumbnail.widthPx, art.thumbnail.heightPx]).toEqual([20, 40]);
		expect(art.dpiX).toBeCloseTo(300, 6);
	});

	it('goes by the bytes, not the name: a JPEG called .png is a JPEG', async () => {
		const art = await inspectArt(await solidJpeg(10, 10), 'really-a-jpeg.png');
		expect(art.mime).toBe('image/jpeg');
	});
});

/* -------------------------------------------------------- type and size */

describe('type and size caps', () => {
	it('refuses a file whose bytes are not PNG, JPEG or SVG, whatever its name', async () => {
		// GIF89a signature (GIF 89a spec §17), a 1 × 1 logical screen.
		const gif = concat(ascii('GIF89a'), new Uint8Array([1, 0, 1, 0, 0, 0, 0]), ascii(';'));
		const error = await rejection(inspectArt(gif, 'card-front.png'));
		expect(error.status).toBe(400);
		expect(error.reason).toBe('not-an-image');
		expect(error.message).toContain('This file is not a PNG, JPEG or SVG image');
		expect(error.message).toContain('GIF');
		const text = await rejection(inspectArt(ascii('just some notes'), 'notes.png'));
		expect(text.message).toContain('This file is not a PNG, JPEG or SVG image');
	});

	it('refuses markup whose root is not <svg>', async () => {
		const error = await rejection(inspectArt(ascii('<?xml version="1.0"?><html><body/></html>'), 'page.svg'));
		expect(error.reason).toBe('not-an-image');
	});

	it('refuses a file one byte over 25 MB with 413, before looking inside', async () => {
		const error = await rejection(inspectArt(new Uint8Array(MAX_ART_BYTES + 1), 'poster.png'));
		expect(error.status).toBe(413);
		expect(error.reason).toBe('too-large');
		expect(error.message).toContain('25 MB');
	});

	it('takes caps from the caller', async () => {
		const png = await solidPng(100, 100);
		expect((await rejection(inspectArt(png, 'a.png', { maxBytes: 100 }))).status).toBe(413);
		expect((await rejection(inspectArt(png, 'a.png', { maxPixels: 9_999 }))).reason).toBe('too-many-pixels');
	});
});

/* ---------------------------------------------------------------- SVG */

describe('SVG', () => {
	it('accepts a clean SVG with its size in mm and a thumbnail drawn by resvg', async () => {
		// CSS Values 3 §6.2: 1in = 96px = 25.4mm, so 63.5 × 88.9 mm (2.5 × 3.5 in) is 240 × 336 px.
		const bytes = new TextEncoder().encode(
			'\ufeff<?xml version="1.0" encoding="UTF-8"?>\n<!-- exported art -->\n' +
				'<svg xmlns="http://www.w3.org/2000/svg" width="63.5mm" height="88.9mm" viewBox="0 0 635 889">' +
				'<defs><linearGradient id="g"><stop offset="0" stop-color="#fff"/></linearGradient></defs>' +
				'<style>.shell { fill: #c83c28 }</style>' +
				'<rect width="318" height="889" class="shell"/><rect x="318" width="317" height="889" fill="#1e50c8"/>' +
				'<circle cx="318" cy="444" r="40" fill="url(#g)"/></svg>'
		);
		const art = await inspectArt(bytes, 'snail.svg');
		expect(art.mime).toBe('image/svg+xml');
		expect([art.widthPx, art.heightPx]).toEqual([240, 336]);
		expect(art.dpiX).toBeUndefined();
		expect(art.bytes).toEqual(bytes);
		// Long side at most 320: width ⌊320 × 240 / 336⌋ = 228, height 228 × 336 / 240 = 319.2 → 319.
		expect(imageSize(art.thumbnail.bytes)).toMatchObject({ type: 'png', width: 228, height: 319 });
		const thumb = await Jimp.read(Buffer.from(art.thumbnail.bytes));
		const pixel = (x: number, y: number) => thumb.getPixelColor(x, y) >>> 8;
		expect(pixel(40, 40)).toBe(0xc83c28);
		expect(pixel(190, 40)).toBe(0x1e50c8);
	});

	it('takes the size from the viewBox when width and height are absent, or % of it', async () => {
		const art = await inspectArt(svg('<rect width="10" height="10"/>', 'viewBox="0 0 400 200"'), 'a.svg');
		expect([art.widthPx, art.heightPx]).toEqual([400, 200]);
		expect([art.thumbnail.widthPx, art.thumbnail.heightPx]).toEqual([320, 160]);
		const percent = await inspectArt(svg('', 'width="100%" height="100%" viewBox="0 0 30 60"'), 'b.svg');
		expect([percent.widthPx, percent.heightPx]).toEqual([30, 60]);
		// One side given: the other follows the viewBox's shape. 1in = 96px.
		const inches = await inspectArt(svg('', 'width="2in" viewBox="0 0 10 20"'), 'c.svg');
		expect([inches.widthPx, inches.heightPx]).toEqual([192, 384]);
	});

	it('refuses an SVG with no size', async () => {
		expect((await rejection(inspectArt(svg('', ''), 'a.svg'))).reason).toBe('no-size');
		expect((await rejection(inspectArt(svg('', 'width="0" height="10"'), 'b.svg'))).reason).toBe('no-size');
	});

	it('accepts an embedded PNG data URL within the pixel cap', async () => {
		const png = await solidPng(8, 8);
		const art = await inspectArt(svg(`<image width="100" height="50" href="data:image/png;base64,${base64(png)}"/>`), 'a.svg');
		expect(art.thumbnail.widthPx).toBe(320);
	});

	const refusals: [what: string, body: Uint8Array, mentions: string][] = [
		['a <script> element', svg('<script>alert(1)</script>'), '<script>'],
		['an onload handler', svg('<rect width="1" height="1" onload="alert(1)"/>'), 'onload'],
		['a <foreignObject>', svg('<foreignObject width="10" height="10"><p>hi</p></foreignObject>'), 'foreignObject'],
		['a javascript: link', svg('<a href="javascript:alert(1)"><rect width="1" height="1"/></a>'), 'javascript:'],
		['a javascript: link hidden by character references', svg('<a xlink:href="&#x6A;ava&#9;script:alert(1)"><rect/></a>'), 'script link'],
		['an external href', svg('<image width="10" height="10" href="http://example.com/a.png"/>'), 'http://example.com/a.png'],
		['an xlink:href to another file', svg('<use xlink:href="parts.svg#runner"/>'), 'parts.svg#runner'],
		[
			'an XLink href under another prefix',
			new TextEncoder().encode(
				'<svg xmlns="http://www.w3.org/2000/svg" xmlns:q="http://www.w3.org/1999/xlink" width="1" height="1"><use q:href="file:///etc/passwd"/></svg>'
			),
			'file:///etc/passwd'
		],
		['a url() to another file in a style attribute', svg('<rect style="fill: url(http://example.com/p.svg#x)"/>'), 'http://example.com'],
		['a url() in a presentation attribute', svg('<rect filter="url(\'other.svg#blur\')"/>'), 'other.svg'],
		['a CSS-escaped url()', svg('<style>rect { fill: u\\72l(https://example.com/x) }</style>'), 'example.com'],
		['@import in a style sheet', svg('<style>@import "https://example.com/a.css";</style>'), '@import'],
		['@import split by a comment', svg('<style>@im<!-- -->port "x.css";</style>'), '@import'],
		['@import under a child of <style>', svg('<style><g>@import "x.css";</g></style>'), '@import'],
		['an animation that rewrites a link', svg('<a href="#a"><set attributeName="href" to="https://example.com"/></a>'), 'href'],
		['a style sheet processing instruction', new TextEncoder().encode('<?xml-stylesheet href="https://example.com/a.css"?>' + new TextDecoder().decode(svg(''))), 'xml-stylesheet'],
		['an HTML element by namespace', svg('<h:iframe xmlns:h="http://www.w3.org/1999/xhtml"/>'), 'iframe'],
		['an embedded SVG', svg('<image href="data:image/svg+xml;base64,PHN2Zy8+"/>'), 'only PNG and JPEG'],
		['xml:base', svg('<g xml:base="https://example.com/"><use href="#a"/></g>'), 'xml:base']
	];

	it.each(refusals)('refuses %s, naming what it found', async (_, body, mentions) => {
		const error = await rejection(inspectArt(body, 'art.svg'));
		expect(error.status).toBe(400);
		expect(error.reason).toBe('unsafe-svg');
		expect(error.message).toContain(mentions);
	});

	it('refuses a DOCTYPE with ENTITY declarations (billion laughs, XXE)', async () => {
		const laughs =
			'<?xml version="1.0"?><!DOCTYPE svg [<!ENTITY lol "lol"><!ENTITY lol2 "&lol;&lol;&lol;&lol;">' +
			'<!ENTITY xxe SYSTEM "file:///etc/passwd">]>' +
			'<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><text>&lol2;&xxe;</text></svg>';
		const error = await rejection(inspectArt(new TextEncoder().encode(laughs), 'laughs.svg'));
		expect(error.reason).toBe('unsafe-svg');
		expect(error.message).toContain('<!ENTITY');
		const plainDoctype =
			'<!DOCTYPE svg PUBLIC "-//W3C//DTD SVG 1.1//EN" "http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd">' +
			new TextDecoder().decode(svg(''));
		expect((await rejection(inspectArt(new TextEncoder().encode(plainDoctype), 'old.svg'))).message).toContain('DOCTYPE');
	});

	it('refuses an embedded PNG whose header claims 30000 × 30000, without decoding it', async () => {
		const read = vi.spyOn(Jimp, 'read');
		const body = svg(`<image width="10" height="10" xlink:href="data:image/png;base64,${base64(pngHeaderOnly(30000, 30000))}"/>`);
		const error = await rejection(inspectArt(body, 'art.svg'));
		expect(error.reason).toBe('too-many-pixels');
		expect(error.message).toContain('megapixels');
		expect(read).not.toHaveBeenCalled();
	});

	it('counts an embedded image each time it is reused', async () => {
		// 2000 × 2000 px = 4 MP, drawn 1 + 30 times = 124 MP > 100 MP.
		const image = `<image id="i" width="1" height="1" href="data:image/png;base64,${base64(pngHeaderOnly(2000, 2000))}"/>`;
		const uses = '<use href="#i"/>'.repeat(30);
		const error = await rejection(inspectArt(svg(image + uses), 'art.svg'));
		expect(error.reason).toBe('too-many-pixels');
		expect(error.message).toContain('each reuse');
	});

	it('refuses nested <use> fan-out that would draw billions of elements', async () => {
		let defs = '<rect id="l0" width="1" height="1"/>';
		for (let level = 1; level <= 9; level++)
			defs += `<g id="l${level}">${`<use href="#l${level - 1}"/>`.repeat(10)}</g>`;
		const error = await rejection(inspectArt(svg(`<defs>${defs}</defs><use href="#l9"/>`), 'bomb.svg'));
		expect(error.reason).toBe('unsafe-svg');
		expect(error.message).toContain('elements as drawn');
	});

	it('refuses XML that is not well-formed', async () => {
		const error = await rejection(inspectArt(svg('<g><rect></g>'), 'broken.svg'));
		expect(error.reason).toBe('unreadable');
		expect(error.message).toContain('well-formed');
	});

	it('accepts editor metadata and a self-referencing gradient chain', async () => {
		const body =
			'<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" ' +
			'xmlns:inkscape="http://www.inkscape.org/namespaces/inkscape" width="20" height="20">' +
			'<linearGradient id="a"><stop offset="0" stop-color="red"/></linearGradient>' +
			'<linearGradient id="b" xlink:href="#a"/>' +
			'<g inkscape:label="image (1)" inkscape:groupmode="layer"><rect width="20" height="20" fill="url(#b)"/></g></svg>';
		const art = await inspectArt(new TextEncoder().encode(body), 'inkscape.svg');
		expect([art.widthPx, art.heightPx]).toEqual([20, 20]);
	});
});
