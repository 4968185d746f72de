import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Jimp } from 'jimp';
import { PDFDocument, drawObject, popGraphicsState, pushGraphicsState, concatTransformationMatrix, type PDFRef } from 'pdf-lib';
import { describe, expect, it } from 'vitest';
import type { ImageAsset } from './display-list';
import { decodePng, encodeImagesAhead, PdfImageCache, writePixelImage, type EncodedImageStore, type EncodedPixels } from './pdf-image';
import { qpdfCheck, qpdfJson, withFile } from './testing/poppler';

/** PNG colour types and filter types (PNG spec, ISO/IEC 15948 §6.1 and §9.2). */
const COLOUR_TYPES = { grey: 0, rgb: 2, greyAlpha: 4, rgba: 6 } as const;
const FILTERS = [0, 1, 2, 3, 4] as const;

/** A small picture with every channel varying, a few see-through pixels, odd sizes (rows do not align). */
function picture(width = 37, height = 23) {
	const image = new Jimp({ width, height, color: 0xffffffff });
	for (let y = 0; y < height; y++)
		for (let x = 0; x < width; x++) {
			const i = (y * width + x) * 4;
			image.bitmap.data[i] = (x * 7 + y * 3) & 255;
			image.bitmap.data[i + 1] = (x * x + y * 11) & 255;
			image.bitmap.data[i + 2] = (255 - x * 5 - y * 2) & 255;
			image.bitmap.data[i + 3] = (x + y) % 9 === 0 ? (x * 13) & 255 : 255;
		}
	return image;
}

describe('decodePng', () => {
	for (const [name, colorType] of Object.entries(COLOUR_TYPES))
		for (const filterType of FILTERS)
			it(`reads 8-bit ${name} written with filter ${filterType} as jimp (pngjs) reads it`, async () => {
				const png = new Uint8Array(await picture().getBuffer('image/png', { colorType, filterType }));
				const ours = decodePng(png)!;
				// The independent reader decodes the same file to RGBA.
				const ref = (await Jimp.read(Buffer.from(png))).bitmap;
				expect([ours.widthPx, ours.heightPx]).toEqual([ref.width, ref.height]);
				const channels = colorType === 0 || colorType === 4 ? 1 : 3;
				expect(ours.channels).toBe(channels);
				const hasAlpha = colorType === 4 || colorType === 6;
				expect(ours.alpha !== null).toBe(hasAlpha);
				for (let p = 0; p < ref.width * ref.height; p++) {
					for (let c = 0; c < channels; c++) expect(ours.colour[p * channels + c]).toBe(ref.data[p * 4 + c]);
					if (hasAlpha) expect(ours.alpha![p]).toBe(ref.data[p * 4 + 3]);
				}
			});

	it('leaves out the alpha of a picture whose every pixel is opaque', async () => {
		const image = picture();
		for (let i = 3; i < image.bitmap.data.length; i += 4) image.bitmap.data[i] = 255;
		const png = new Uint8Array(await image.getBuffer('image/png', { colorType: 6, filterType: 4 }));
		expect(decodePng(png)!.alpha).toBeNull();
	});
});

/** A page showing one image object at 4 pt a pixel, rendered in colour by poppler (pdftoppm, PPM bytes). */
async function rendered(place: (doc: PDFDocument) => Promise<PDFRef> | PDFRef, width: number, height: number) {
	const doc = await PDFDocument.create();
	const page = doc.addPage([width * 4, height * 4]);
	const name = page.node.newXObject('Im', await place(doc));
	page.pushOperators(pushGraphicsState(), concatTransformationMatrix(width * 4, 0, 0, height * 4, 0, 0), drawObject(name), popGraphicsState());
	const bytes = await doc.save();
	qpdfCheck(bytes);
	const ppm = withFile(bytes, (path, dir) => {
		execFileSync('pdftoppm', ['-r', '72', '-singlefile', path, join(dir, 'out')]);
		return readFileSync(join(dir, 'out.ppm'));
	});
	return { bytes, ppm };
}

const memoryStore = (): EncodedImageStore & { kept: Map<string, EncodedPixels> } => {
	const kept = new Map<string, EncodedPixels>();
	return { kept, get: (k) => kept.get(k), set: (k, v) => void kept.set(k, v) };
};

describe('PNG rows kept as they are (PNG predictors, ISO 32000-1 §7.4.4.4)', () => {
	for (const [name, colorType] of Object.entries(COLOUR_TYPES))
		for (const filterType of FILTERS)
			it(`8-bit ${name}, filter ${filterType}: poppler draws the same pixels as from the decoded picture`, async () => {
				const png = new Uint8Array(await picture().getBuffer('image/png', { colorType, filterType }));
				const asset: ImageAsset = { id: `p-${name}-${filterType}`, mime: 'image/png', bytes: png, widthPx: 37, heightPx: 23 };
				// Reference: the pixels decoded (checked against jimp above) and written as plain samples.
				const reference = await rendered((doc) => writePixelImage(doc, decodePng(png)!), 37, 23);
				const store = memoryStore();
				const kept = await rendered((doc) => new PdfImageCache(doc, new Map([[asset.id, asset]]), store).ref(asset.id), 37, 23);
				expect(kept.ppm.equals(reference.ppm)).toBe(true);
				const encoded = [...store.kept.values()][0];
				expect(encoded.pngRows).toBe(true);
				expect(encoded.alpha !== null).toBe(colorType === 4 || colorType === 6);
				// Encoded ahead, on libuv's threads: the same streams.
				const ahead = memoryStore();
				await (await encodeImagesAhead([asset], ahead)).compressed;
				const early = [...ahead.kept.values()][0];
				expect(Buffer.from(early.colour).equals(Buffer.from(encoded.colour))).toBe(true);
				expect(early.alpha && Buffer.from(early.alpha).equals(Buffer.from(encoded.alpha!))).toBe(encoded.alpha ? true : null);
			});

	it('an opaque RGBA picture gets no soft mask; an RGB one goes in as the file holds it', async () => {
		const image = picture();
		for (let i = 3; i < image.bitmap.data.length; i += 4) image.bitmap.data[i] = 255;
		const rgba = new Uint8Array(await image.getBuffer('image/png', { colorType: 6, filterType: 4 }));
		const rgb = new Uint8Array(await image.getBuffer('image/png', { colorType: 2, filterType: 4 }));
		for (const [id, bytes] of [['rgba', rgba], ['rgb', rgb]] as const) {
			const asset: ImageAsset = { id, mime: 'image/png', bytes, widthPx: 37, heightPx: 23 };
			const { bytes: pdf } = await rendered((doc) => new PdfImageCache(doc, new Map([[id, asset]])).ref(id), 37, 23);
			const objects = Object.values(qpdfJson(pdf).qpdf[1] as Record<string, { stream?: { dict: Record<string, unknown> } }>);
			const images = objects.filter((o) => o.stream?.dict['/Subtype'] === '/Image');
			expect(images).toHaveLength(1);
			expect(images[0].stream!.dict['/SMask']).toBeUndefined();
			expect(images[0].stream!.dict['/DecodeParms']).toMatchObject({ '/Predictor': 15, '/Colors': 3, '/Columns': 37 });
		}
	});

	it('refuses a PNG whose image data is cut short, rather than embedding it', async () => {
		const png = new Uint8Array(await picture().getBuffer('image/png', { colorType: 2, filterType: 1 }));
		// Keep the chunks but lose the end of the compressed rows: the IDAT chunk's body is cut in half.
		const view = new DataView(png.buffer, png.byteOffset);
		let at = 8;
		while (String.fromCharCode(...png.subarray(at + 4, at + 8)) !== 'IDAT') at += 12 + view.getUint32(at);
		const length = view.getUint32(at);
		const cut = new Uint8Array([...png.subarray(0, at), 0, 0, 0, 0, ...png.subarray(at + 4, at + 8 + (length >> 1)), 0, 0, 0, 0, ...png.subarray(png.length - 12)]);
		new DataView(cut.buffer).setUint32(at, length >> 1);
		const asset: ImageAsset = { id: 'cut', mime: 'image/png', bytes: cut, widthPx: 37, heightPx: 23 };
		const doc = await PDFDocument.create();
		await expect(new PdfImageCache(doc, new Map([[asset.id, asset]])).ref(asset.id)).rejects.toThrow();
	});
});
