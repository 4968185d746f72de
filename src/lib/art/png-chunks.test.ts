/**
 * The PNG walk against files made outside the project: jimp writes the PNGs, image-size (an
 * independent header reader) says their size, and the chunk layout is the PNG spec's (ISO/IEC
 * 15948:2004 §5: signature, then length-type-data-CRC chunks, IHDR first and IEND last).
 */
import { inflateSync } from 'node:zlib';
import { imageSize } from 'image-size';
import { Jimp } from 'jimp';
import { describe, expect, it } from 'vitest';
import { isPng, pngChunks, readPngParts } from './png-chunks';

async function jimpPng(width: number, height: number): Promise<Uint8Array> {
	const image = new Jimp({ width, height, color: 0x3366ccff });
	return new Uint8Array(await image.getBuffer('image/png'));
}

describe('reading a PNG file', () => {
	it('walks the chunks in order, IHDR first and IEND last (§5.6)', async () => {
		const types = [...pngChunks(await jimpPng(7, 5))].map((c) => c.type);
		expect(types[0]).toBe('IHDR');
		expect(types.at(-1)).toBe('IEND');
		expect(types).toContain('IDAT');
	});

	it('reads the header as an independent reader does, and the pixel data inflates to every row (§7.2)', async () => {
		const bytes = await jimpPng(37, 11);
		const size = imageSize(bytes);
		const png = readPngParts(bytes)!;
		expect([png.width, png.height]).toEqual([size.width, size.height]);
		expect(png.truncated).toBe(false);
		// Each row is a filter byte, then its samples: colour type 6 (RGBA, §11.2.2 Table 11.1) at 8 bits.
		expect([png.colour, png.depth, png.interlace]).toEqual([6, 8, 0]);
		const raw = inflateSync(Buffer.concat(png.data));
		expect(raw.length).toBe(png.height * (1 + png.width * 4));
	});

	it('tells a file cut short, and refuses what is not a PNG', async () => {
		const bytes = await jimpPng(20, 20);
		const cut = bytes.subarray(0, bytes.length - 20);
		expect(readPngParts(cut)!.truncated).toBe(true);
		expect([...pngChunks(cut)].at(-1)!.whole).toBe(false);
		expect(isPng(bytes)).toBe(true);
		expect(isPng(bytes.subarray(0, 7))).toBe(false);
		expect(readPngParts(new TextEncoder().encode('GIF89a not a png at all'))).toBeNull();
	});

	it('leaves the size at 0 when the header is shorter than the spec says (13 bytes, §11.2.2)', async () => {
		const bytes = await jimpPng(4, 4);
		const short = new Uint8Array(bytes);
		// IHDR's length field, just after the 8-byte signature.
		new DataView(short.buffer).setUint32(8, 12);
		expect(readPngParts(short)!.width).toBe(0);
	});
});
