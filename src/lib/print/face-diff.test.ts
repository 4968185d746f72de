import { describe, expect, it } from 'vitest';
import { Jimp } from 'jimp';
import { diffFaces, DIFF_COLOURS } from './face-diff';

type Image = InstanceType<typeof Jimp>;

const png = async (width: number, height: number, paint?: (img: Image) => void) => {
	const img = new Jimp({ width, height, color: 0xffffffff });
	paint?.(img);
	return new Uint8Array(await img.getBuffer('image/png'));
};
const square = (x0: number, y0: number, size: number, color: number) => (img: Image) => {
	for (let y = y0; y < y0 + size; y++) for (let x = x0; x < x0 + size; x++) img.setPixelColor(color, x, y);
};

describe('the pixel difference of two faces', () => {
	it('finds no difference between identical faces', async () => {
		const a = await png(40, 60, square(5, 5, 10, 0x000000ff));
		const d = await diffFaces(a, a);
		expect(d.changedPixels).toBe(0);
		expect([d.widthPx, d.heightPx]).toEqual([40, 60]);
	});

	it('counts and marks exactly the pixels that changed, by whether they got darker', async () => {
		const a = await png(40, 60);
		const b = await png(40, 60, square(10, 20, 8, 0x000000ff));
		const d = await diffFaces(a, b);
		// A hard-edged 8 × 8 black square on white: 64 pixels, none of them anti-aliasing.
		expect(d.changedPixels).toBe(64);
		const out = await Jimp.read(Buffer.from(d.png));
		const at = (x: number, y: number) => {
			const i = (y * 40 + x) * 4;
			return [...out.bitmap.data.subarray(i, i + 3)];
		};
		expect(at(12, 22)).toEqual(DIFF_COLOURS.darker);
		expect(at(30, 50)).not.toEqual(DIFF_COLOURS.darker);
		const back = await diffFaces(b, a);
		expect(back.changedPixels).toBe(64);
	});

	it('compares faces of different sizes on a white canvas of the larger', async () => {
		const d = await diffFaces(await png(40, 60), await png(44, 64));
		expect([d.widthPx, d.heightPx]).toEqual([44, 64]);
		expect(d.changedPixels).toBe(0);
	});
});
