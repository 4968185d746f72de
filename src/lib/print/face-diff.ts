/**
 * The pixel difference of two renderings of a face (two proofs of one card): both PNGs are laid
 * on a white canvas of the larger size, compared pixel by pixel (pixelmatch, which skips
 * anti-aliasing), and drawn as one PNG with the unchanged picture faded and the differing pixels
 * marked: `darker` where the second is darker, `lighter` where it is lighter.
 */
import pixelmatch from 'pixelmatch';

export interface FaceDiff {
	png: Uint8Array;
	widthPx: number;
	heightPx: number;
	changedPixels: number;
}

/** Marking colours (RGB): a blue and a red that stay apart for the common colour-vision deficiencies. */
export const DIFF_COLOURS = { lighter: [214, 40, 40] as [number, number, number], darker: [20, 90, 200] as [number, number, number] };

/** pixelmatch's own default threshold (a perceptual colour distance), kept. */
const THRESHOLD = 0.1;

async function decode(png: Uint8Array) {
	const { Jimp } = await import('jimp');
	const image = await Jimp.read(Buffer.from(png));
	return { width: image.bitmap.width, height: image.bitmap.height, data: new Uint8Array(image.bitmap.data) };
}

/** The image on an opaque white canvas of `width` × `height`, top-left aligned. */
function onCanvas(img: { width: number; height: number; data: Uint8Array }, width: number, height: number): Uint8Array {
	const out = new Uint8Array(width * height * 4).fill(255);
	for (let y = 0; y < img.height; y++) {
		for (let x = 0; x < img.width; x++) {
			const s = (y * img.width + x) * 4;
			const d = (y * width + x) * 4;
			const a = img.data[s + 3] / 255;
			// Composite over white, so transparent corners compare as the paper they print on.
			for (let c = 0; c < 3; c++) out[d + c] = Math.round(img.data[s + c] * a + 255 * (1 - a));
			out[d + 3] = 255;
		}
	}
	return out;
}

export async function diffFaces(before: Uint8Array, after: Uint8Array): Promise<FaceDiff> {
	const [a, b] = await Promise.all([decode(before), decode(after)]);
	const width = Math.max(a.width, b.width);
	const height = Math.max(a.height, b.height);
	const output = new Uint8Array(width * height * 4);
	const changedPixels = pixelmatch(onCanvas(a, width, height), onCanvas(b, width, height), output, width, height, {
		threshold: THRESHOLD,
		alpha: 0.15,
		diffColor: DIFF_COLOURS.lighter,
		diffColorAlt: DIFF_COLOURS.darker
	});
	const { Jimp } = await import('jimp');
	const image = new Jimp({ width, height });
	image.bitmap.data = Buffer.from(output);
	const png = new Uint8Array(await image.getBuffer('image/png'));
	return { png, widthPx: width, heightPx: height, changedPixels };
}
