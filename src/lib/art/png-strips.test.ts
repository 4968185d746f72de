/**
 * The strip reader against pngjs (a general PNG library, the reference here): every pixel of
 * files pngjs writes with each filter, colour type and bit depth, read back at full size.
 */
import { describe, expect, it } from 'vitest';
import { PNG } from 'pngjs';
import { pngStripThumbnail, PngStripError } from './png-strips';

function picture(width: number, height: number) {
	const data = Buffer.alloc(width * height * 4);
	for (let y = 0; y < height; y++)
		for (let x = 0; x < width; x++) {
			const i = (y * width + x) * 4;
			data[i] = (x * 7 + y) & 0xff;
			data[i + 1] = (y * 5) & 0xff;
			data[i + 2] = (x * y) & 0xff;
			data[i + 3] = 255;
		}
	return data;
}

describe('PNG read in strips', () => {
	const width = 37;
	const height = 23;
	const cases: { colorType: 0 | 2 | 4 | 6; bitDepth: 8 | 16; filterType: number }[] = [];
	for (const colorType of [0, 2, 4, 6] as const)
		for (const bitDepth of [8, 16] as const) for (const filterType of [0, 1, 2, 3, 4]) cases.push({ colorType, bitDepth, filterType });

	for (const c of cases) {
		it(`colour type ${c.colorType}, ${c.bitDepth} bits, filter ${c.filterType}: same pixels as pngjs`, async () => {
			const png = new PNG({ width, height, colorType: c.colorType, bitDepth: c.bitDepth, inputHasAlpha: true, filterType: c.filterType });
			png.data = picture(width, height);
			const bytes = PNG.sync.write(png, { colorType: c.colorType, bitDepth: c.bitDepth, inputHasAlpha: true, filterType: c.filterType });
			const reference = PNG.sync.read(bytes);
			const strips = await pngStripThumbnail(new Uint8Array(bytes), width, height);
			expect([strips.widthPx, strips.heightPx]).toEqual([width, height]);
			// Fully transparent pixels have no colour to keep: compare their alpha only.
			const want = Buffer.from(reference.data);
			for (let i = 0; i < want.length; i += 4) if (want[i + 3] === 0) want.fill(0, i, i + 3);
			expect(Buffer.from(strips.rgba).equals(want)).toBe(true);
		});
	}

	it('a box-filtered thumbnail averages the pixels it covers', async () => {
		const png = new PNG({ width: 4, height: 2 });
		// Left half black, right half white: a 2 × 1 thumbnail is one black and one white pixel.
		for (let x = 0; x < 4; x++)
			for (let y = 0; y < 2; y++) png.data.set(x < 2 ? [0, 0, 0, 255] : [255, 255, 255, 255], (y * 4 + x) * 4);
		const strips = await pngStripThumbnail(new Uint8Array(PNG.sync.write(png)), 2, 1);
		expect([...strips.rgba]).toEqual([0, 0, 0, 255, 255, 255, 255, 255]);
	});

	it('a file whose data stops short is refused', async () => {
		const png = new PNG({ width: 50, height: 50 });
		png.data = picture(50, 50);
		const bytes = new Uint8Array(PNG.sync.write(png));
		// Declare twice the rows the data holds (IHDR height at bytes 20–23; its CRC is not checked here).
		const lying = bytes.slice();
		new DataView(lying.buffer).setUint32(20, 100);
		await expect(pngStripThumbnail(lying, 10, 10)).rejects.toBeInstanceOf(PngStripError);
	});
});

describe('a PNG that holds more than its header says', () => {
	it('is refused, without inflating the rest', async () => {
		const big = new PNG({ width: 300, height: 300 });
		big.data = picture(300, 300);
		const bytes = new Uint8Array(PNG.sync.write(big, { filterType: 0 }));
		// Say 300 × 10 in the header; the data still holds 300 rows.
		const taller = bytes.slice();
		new DataView(taller.buffer).setUint32(20, 10);
		await expect(pngStripThumbnail(taller, 10, 10)).rejects.toThrow(/more pixels than its 300 × 10 px/);
		// Say 10 × 10: the rows no longer line up with their filter bytes, or run over.
		const smaller = bytes.slice();
		new DataView(smaller.buffer).setUint32(16, 10);
		new DataView(smaller.buffer).setUint32(20, 10);
		await expect(pngStripThumbnail(smaller, 10, 10)).rejects.toBeInstanceOf(PngStripError);
	});
});
