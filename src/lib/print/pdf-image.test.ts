import { Jimp } from 'jimp';
import { describe, expect, it } from 'vitest';
import { decodePng } from './pdf-image';

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
