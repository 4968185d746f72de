import { Jimp } from 'jimp';
import { PDFDocument } from 'pdf-lib';
import { describe, expect, it } from 'vitest';
import { zlibSync } from 'fflate';
import type { FaceLayout, ImageAsset } from './display-list';
import { loadFonts } from './fonts';
import { mmToPt } from './paper';
import { decodePng, writePixelImage } from './pdf-image';
import { hexToCmyk, PdfFaceWriter } from './pdf';
import { renderFacePng } from './png';
import { pdftotext, greyAtMm, inkedPixelsMm, meanGreyMm, qpdfCheck, qpdfContents, qpdfJson, rasterGrey } from './testing/poppler';

const black = { hex: '#000000' };
const PAGE_W = 100;
const PAGE_H = 120;
const AT = { xMm: 10, yMm: 10 };

async function jpegAsset(): Promise<ImageAsset> {
	// jimp writes an ordinary baseline JPEG: a flat grey of 100, so the rendered level is known.
	const img = new Jimp({ width: 40, height: 32, color: 0x646464ff });
	const bytes = new Uint8Array(await img.getBuffer('image/jpeg', { quality: 95 }));
	return { id: 'grey-jpeg', mime: 'image/jpeg', bytes, widthPx: 40, heightPx: 32 };
}

async function halfTransparentPng(): Promise<ImageAsset> {
	// Left half opaque black, right half fully transparent.
	const img = new Jimp({ width: 40, height: 32, color: 0x00000000 });
	for (let y = 0; y < 32; y++) for (let x = 0; x < 20; x++) img.setPixelColor(0x000000ff, x, y);
	const bytes = new Uint8Array(await img.getBuffer('image/png'));
	return { id: 'half-png', mime: 'image/png', bytes, widthPx: 40, heightPx: 32 };
}

function sampleFace(): FaceLayout {
	return {
		trimWidthMm: 63.5,
		trimHeightMm: 88.9,
		bleedMm: 3,
		safeMm: 5,
		warnings: [],
		items: [
			// Full-bleed light background so clipping shows.
			{ type: 'rect', xMm: 0, yMm: 0, wMm: 69.5, hMm: 94.9, fill: { hex: '#c0c0c0' } },
			{ type: 'rect', xMm: 5, yMm: 5, wMm: 20, hMm: 10, fill: black },
			{ type: 'rect', xMm: 30, yMm: 5, wMm: 25, hMm: 15, radiusMm: 5, fill: black },
			{ type: 'ellipse', cxMm: 15, cyMm: 30, rxMm: 8, ryMm: 5, fill: black },
			{ type: 'path', d: 'M 35 30 L 55 30 L 45 40 Z', fill: black },
			{ type: 'line', x1Mm: 5, y1Mm: 45, x2Mm: 60, y2Mm: 45, stroke: black, strokeMm: 1 },
			{ type: 'text', xMm: 5, yMm: 58, text: 'Hare 12', sizePt: 18, weight: 'bold', fill: black, widthMm: 30 },
			{ type: 'image', xMm: 5, yMm: 65, wMm: 25, hMm: 20, imageId: 'grey-jpeg' },
			{ type: 'image', xMm: 35, yMm: 65, wMm: 25, hMm: 20, imageId: 'half-png' },
			// Second use of the same JPEG: must not embed it again.
			{ type: 'image', xMm: 5, yMm: 86, wMm: 10, hMm: 5, imageId: 'grey-jpeg' }
		]
	};
}

async function render(options: { clipToTrim?: boolean; colour?: 'rgb' | 'cmyk'; face?: FaceLayout } = {}) {
	const face = options.face ?? sampleFace();
	const doc = await PDFDocument.create();
	const writer = await PdfFaceWriter.create(doc, {
		fonts: await loadFonts(),
		images: [await jpegAsset(), await halfTransparentPng()],
		colour: options.colour
	});
	const page = doc.addPage([mmToPt(PAGE_W), mmToPt(PAGE_H)]);
	const faceH = face.trimHeightMm + 2 * face.bleedMm;
	const yPt = mmToPt(PAGE_H - AT.yMm - faceH);
	const clipPt = options.clipToTrim
		? {
				xPt: mmToPt(AT.xMm + face.bleedMm),
				yPt: yPt + mmToPt(face.bleedMm),
				widthPt: mmToPt(face.trimWidthMm),
				heightPt: mmToPt(face.trimHeightMm)
			}
		: undefined;
	await writer.drawFace(page, face, { xPt: mmToPt(AT.xMm), yPt, clipPt });
	// A second page drawing the same face: images still embedded once per document.
	const page2 = doc.addPage([mmToPt(PAGE_W), mmToPt(PAGE_H)]);
	await writer.drawFace(page2, face, { xPt: mmToPt(AT.xMm), yPt });
	return { bytes: await doc.save(), writer };
}

/** Grey value at a face coordinate (mm from the face's top-left bleed corner). */
const at = (img: ReturnType<typeof rasterGrey>, x: number, y: number) => greyAtMm(img, AT.xMm + x, AT.yMm + y);

describe('PDF face backend', () => {
	it('draws shapes, text and images where the display list puts them (read back with pdftoppm)', async () => {
		const { bytes, writer } = await render();
		qpdfCheck(bytes); // qpdf --check: the file is structurally sound (ISO 32000-1 syntax)
		const img = rasterGrey(bytes, 1, 150);
		// Rectangle interior inked, just outside it the light background (pdftoppm -gray, 150 dpi).
		expect(at(img, 15, 10)).toBeLessThan(40);
		expect(at(img, 26, 10)).toBeGreaterThan(150);
		// Rounded corner: the very corner of the box stays background, the middle is inked.
		expect(at(img, 30.4, 5.4)).toBeGreaterThan(150);
		expect(at(img, 42, 12)).toBeLessThan(40);
		// Ellipse: centre inked, a point inside its bounding box but outside the curve is not.
		expect(at(img, 15, 30)).toBeLessThan(40);
		expect(at(img, 22.3, 34.3)).toBeGreaterThan(150);
		// Triangle path: centroid inked; a point inside its box but outside the edges is not (y grows downwards).
		expect(at(img, 45, 33)).toBeLessThan(40);
		expect(at(img, 37, 38)).toBeGreaterThan(150);
		// 1 mm line centred on y = 45.
		expect(at(img, 30, 45)).toBeLessThan(40);
		expect(at(img, 30, 46.5)).toBeGreaterThan(150);
		// Text has ink above its baseline (embedded TrueType subset renders real glyphs).
		expect(inkedPixelsMm(img, AT.xMm + 5, AT.yMm + 52, 30, 6, 100)).toBeGreaterThan(100);
		// JPEG of flat grey 100 comes out near 100.
		expect(Math.abs(meanGreyMm(img, AT.xMm + 8, AT.yMm + 68, 18, 14) - 100)).toBeLessThan(8);
		// PNG: opaque half black, transparent half shows the background through the soft mask.
		expect(meanGreyMm(img, AT.xMm + 37, AT.yMm + 68, 8, 14)).toBeLessThan(20);
		expect(meanGreyMm(img, AT.xMm + 50, AT.yMm + 68, 8, 14)).toBeGreaterThan(180);
		// Bleed is drawn when not clipped.
		expect(at(img, 1, 1)).toBeLessThan(230);
		// Each image written once for the whole document.
		expect(writer.images.embedded).toBe(2);
	});

	it('embeds each image once per document however often it is drawn (qpdf --json objects)', async () => {
		const { bytes } = await render();
		// qpdf JSON v2: qpdf[1] maps "obj:N 0 R" to { value } or { stream: { dict } }.
		const objects = Object.values(qpdfJson(bytes).qpdf[1] as Record<string, any>);
		const images = objects.filter((o) => o?.stream?.dict?.['/Subtype'] === '/Image');
		// JPEG + PNG colour + PNG soft mask (ISO 32000-1 §11.6.5.3 SMask is its own image).
		expect(images.length).toBe(3);
	});

	it('embeds the font as a TrueType subset (ISO 32000-1 §9.9 FontFile2)', async () => {
		const { bytes } = await render();
		const text = qpdfContents(bytes);
		expect(text).toMatch(/\/FontFile2/);
		expect(text).toMatch(/\/BaseFont \/RobotoSlab-Bold/);
		// pdftotext (poppler) reads the words back through the font's ToUnicode map (§9.10.3).
		expect(pdftotext(bytes)).toContain('Hare 12');
	});

	it('clips to a box: nothing outside the clip is inked', async () => {
		const { bytes } = await render({ clipToTrim: true });
		const img = rasterGrey(bytes, 1, 150);
		expect(at(img, 1.5, 40)).toBe(255); // left bleed, outside the trim
		expect(at(img, 40, 93.5)).toBe(255); // bottom bleed
		expect(at(img, 3.5, 40)).toBeLessThan(230); // just inside the trim: background
	});

	it('writes CMYK operators only in cmyk mode, using a colour’s own press value', async () => {
		const face: FaceLayout = {
			trimWidthMm: 20,
			trimHeightMm: 20,
			bleedMm: 0,
			safeMm: 0,
			warnings: [],
			items: [
				{ type: 'rect', xMm: 0, yMm: 0, wMm: 10, hMm: 10, fill: { hex: '#ff0000', cmyk: [0, 0.9, 0.8, 0.05] } },
				{ type: 'rect', xMm: 10, yMm: 0, wMm: 10, hMm: 10, fill: { hex: '#00ff00' } }
			]
		};
		const cmykText = qpdfContents((await render({ face, colour: 'cmyk' })).bytes);
		// ISO 32000-1 §8.6.8: "k" sets a DeviceCMYK fill, "rg" a DeviceRGB one.
		expect(cmykText).toMatch(/0 0\.9 0\.8 0\.05 k/);
		expect(cmykText).toMatch(/1 0 1 0 k/);
		expect(cmykText).not.toMatch(/ rg\n/);
		const rgbText = qpdfContents((await render({ face, colour: 'rgb' })).bytes);
		expect(rgbText).toMatch(/1 0 0 rg/);
	});

	it('looks the same as the SVG backend rendered by resvg (mean grey difference under 3 levels)', async () => {
		const face = sampleFace();
		const assets = [await jpegAsset(), await halfTransparentPng()];
		const doc = await PDFDocument.create();
		const writer = await PdfFaceWriter.create(doc, { fonts: await loadFonts(), images: assets });
		const wMm = face.trimWidthMm + 2 * face.bleedMm;
		const hMm = face.trimHeightMm + 2 * face.bleedMm;
		await writer.drawFace(doc.addPage([mmToPt(wMm), mmToPt(hMm)]), face, { xPt: 0, yPt: 0 });
		const dpi = 100;
		const fromPdf = rasterGrey(await doc.save(), 1, dpi);
		const svgPng = await renderFacePng(face, new Map(assets.map((a) => [a.id, a])), { dpi, background: '#ffffff' });
		const fromSvg = (await Jimp.read(Buffer.from(svgPng.png))).bitmap;
		const w = Math.min(fromPdf.width, fromSvg.width);
		const h = Math.min(fromPdf.height, fromSvg.height);
		let diff = 0;
		for (let y = 0; y < h; y++)
			for (let x = 0; x < w; x++) {
				const i = (y * fromSvg.width + x) * 4;
				// ITU-R BT.601 luma, as poppler's grey output uses.
				const grey = 0.299 * fromSvg.data[i] + 0.587 * fromSvg.data[i + 1] + 0.114 * fromSvg.data[i + 2];
				diff += Math.abs(grey - fromPdf.data[y * fromPdf.width + x]);
			}
		// Edges anti-alias a little differently in the two renderers; the pictures must agree on average.
		expect(diff / (w * h)).toBeLessThan(3);
	});

	it('converts hex to CMYK by the complement formula', () => {
		expect(hexToCmyk('#ffffff')).toEqual([0, 0, 0, 0]);
		expect(hexToCmyk('#000000')).toEqual([0, 0, 0, 1]);
		expect(hexToCmyk('#ff0000')).toEqual([0, 1, 1, 0]);
	});
});

describe('PNG decoding for image objects', () => {
	async function viaJimp(colorType: 0 | 2 | 4 | 6) {
		const img = new Jimp({ width: 13, height: 7, color: 0x00000000 });
		for (let y = 0; y < 7; y++)
			for (let x = 0; x < 13; x++) {
				const v = (x * 19 + y * 31) & 255;
				img.setPixelColor((((v << 24) | (((255 - v) & 255) << 16) | (((v * 3) & 255) << 8) | (x < 6 ? 255 : 128)) >>> 0), x, y);
			}
		const png = new Uint8Array(await img.getBuffer('image/png', { colorType, filterType: -1 as never }));
		const reference = await Jimp.read(Buffer.from(png));
		return { png, reference };
	}

	for (const colorType of [0, 2, 4, 6] as const) {
		it(`matches jimp's decoder for PNG colour type ${colorType}`, async () => {
			const { png, reference } = await viaJimp(colorType);
			const mine = decodePng(png)!;
			const d = reference.bitmap.data;
			for (let p = 0; p < 13 * 7; p++) {
				if (mine.channels === 3) {
					expect([mine.colour[p * 3], mine.colour[p * 3 + 1], mine.colour[p * 3 + 2]]).toEqual([d[p * 4], d[p * 4 + 1], d[p * 4 + 2]]);
				} else {
					expect(mine.colour[p]).toBe(d[p * 4]);
				}
				expect(mine.alpha ? mine.alpha[p] : 255).toBe(d[p * 4 + 3]);
			}
		});
	}

	it('decodes a 2-bit palette PNG with transparency (PNG spec colour type 3)', async () => {
		// Hand-built: 4 × 2 pixels, palette red/green/blue/white, index 3 transparent via tRNS.
		const crc = (b: Uint8Array) => {
			let c = ~0;
			for (const x of b) {
				c ^= x;
				for (let k = 0; k < 8; k++) c = (c >>> 1) ^ (0xedb88320 & -(c & 1));
			}
			return ~c >>> 0;
		};
		const chunk = (name: string, body: number[] | Uint8Array) => {
			const data = new Uint8Array([...name].map((c) => c.charCodeAt(0)).concat([...body]));
			const out = new Uint8Array(12 + body.length);
			new DataView(out.buffer).setUint32(0, body.length);
			out.set(data, 4);
			new DataView(out.buffer).setUint32(8 + body.length, crc(data));
			return out;
		};
		const ihdr = [0, 0, 0, 4, 0, 0, 0, 2, 2, 3, 0, 0, 0];
		const rows = new Uint8Array([0, 0b00011011, 0, 0b11100100]); // row 0: 0 1 2 3, row 1: 3 2 1 0
		const parts = [
			new Uint8Array([137, 80, 78, 71, 13, 10, 26, 10]),
			chunk('IHDR', ihdr),
			chunk('PLTE', [255, 0, 0, 0, 255, 0, 0, 0, 255, 255, 255, 255]),
			chunk('tRNS', [255, 255, 255, 0]),
			chunk('IDAT', zlibSync(rows)),
			chunk('IEND', [])
		];
		const png = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
		let o = 0;
		for (const p of parts) png.set(p, o), (o += p.length);
		const reference = await Jimp.read(Buffer.from(png)); // an independent decoder reads it the same way
		const mine = decodePng(png)!;
		for (let p = 0; p < 8; p++) {
			expect([...mine.colour.subarray(p * 3, p * 3 + 3)]).toEqual([...reference.bitmap.data.subarray(p * 4, p * 4 + 3)]);
			expect(mine.alpha![p]).toBe(reference.bitmap.data[p * 4 + 3]);
		}
		expect([...mine.colour.subarray(0, 3)]).toEqual([255, 0, 0]);
		expect(mine.alpha![3]).toBe(0);
		// And it makes a valid image object.
		const doc = await PDFDocument.create();
		writePixelImage(doc, mine);
		doc.addPage([100, 100]);
		qpdfCheck(await doc.save());
	});
});
