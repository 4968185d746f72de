/**
 * A PNG's thumbnail without holding its whole picture: the compressed data is inflated as a
 * stream and the rows are unfiltered one at a time (only the previous row is kept), each folded
 * into a small box-filtered thumbnail. Memory stays at a few rows plus the thumbnail, whatever the
 * picture's size. Chunk layout, filters and sample formats follow ISO/IEC 15948:2004 (§5, §9, §11).
 * Interlaced files (Adam7) are not read here; callers decode those whole, under a lower cap.
 */
import { createInflate } from 'node:zlib';
import { readPngParts } from './png-chunks';

export interface StripThumbnail {
	widthPx: number;
	heightPx: number;
	/** RGBA, 8 bits a sample, `thumbWidth × thumbHeight × 4` bytes. */
	rgba: Uint8Array;
	thumbWidth: number;
	thumbHeight: number;
}

export class PngStripError extends Error {}

/** Channels per colour type (ISO/IEC 15948 §11.2.2, Table 11.1). */
const CHANNELS: Record<number, number> = { 0: 1, 2: 3, 3: 1, 4: 2, 6: 4 };

/** True when the PNG is interlaced (IHDR byte 12), which this reader leaves to a whole decode. */
export function pngIsInterlaced(bytes: Uint8Array): boolean {
	return bytes.length > 28 && bytes[28] === 1;
}

export async function pngStripThumbnail(bytes: Uint8Array, thumbWidth: number, thumbHeight: number): Promise<StripThumbnail> {
	const png = readPngParts(bytes);
	if (!png) throw new PngStripError('it is not a PNG file');
	if (png.truncated) throw new PngStripError('the file ends inside a chunk');
	const { width, height, depth, colour, interlace, palette, transparency: alpha, data: idat } = png;
	const channels = CHANNELS[colour];
	if (!width || !height || !channels || ![1, 2, 4, 8, 16].includes(depth)) throw new PngStripError('its header is not one PNG allows');
	if (interlace) throw new PngStripError('interlaced files are decoded whole');
	if (colour === 3 && !palette) throw new PngStripError('a palette image without a palette');

	const bitsPerPixel = channels * depth;
	const rowBytes = Math.ceil((width * bitsPerPixel) / 8);
	const bpp = Math.max(1, bitsPerPixel >> 3);
	const max = (1 << Math.min(depth, 8)) - 1;

	// Box filter: sums per thumbnail pixel, weighted by alpha for colour so edges do not darken.
	const sums = new Float64Array(thumbWidth * thumbHeight * 4);
	const counts = new Uint32Array(thumbWidth * thumbHeight);
	const columnOf = new Uint32Array(width);
	for (let x = 0; x < width; x++) columnOf[x] = Math.min(thumbWidth - 1, Math.floor((x * thumbWidth) / width));

	let previous = new Uint8Array(rowBytes);
	let current = new Uint8Array(rowBytes);
	let y = 0;
	let pending = new Uint8Array(0);

	const sample = (row: Uint8Array, x: number, c: number): number => {
		if (depth === 8) return row[x * channels + c];
		if (depth === 16) {
			const i = (x * channels + c) * 2;
			return Math.round(((row[i] << 8) | row[i + 1]) / 257);
		}
		const bit = (x * channels + c) * depth;
		return ((row[bit >> 3] >> (8 - depth - (bit & 7))) & max) * (255 / max);
	};

	const takeRow = (row: Uint8Array) => {
		const ty = Math.min(thumbHeight - 1, Math.floor((y * thumbHeight) / height));
		for (let x = 0; x < width; x++) {
			let r: number, g: number, b: number, a = 255;
			if (colour === 3) {
				const bit = x * depth;
				const index = depth === 8 ? row[x] : (row[bit >> 3] >> (8 - depth - (bit & 7))) & max;
				r = palette![index * 3] ?? 0;
				g = palette![index * 3 + 1] ?? 0;
				b = palette![index * 3 + 2] ?? 0;
				if (alpha && index < alpha.length) a = alpha[index];
			} else if (colour === 0 || colour === 4) {
				r = g = b = sample(row, x, 0);
				if (colour === 4) a = sample(row, x, 1);
			} else {
				r = sample(row, x, 0);
				g = sample(row, x, 1);
				b = sample(row, x, 2);
				if (colour === 6) a = sample(row, x, 3);
			}
			const i = ty * thumbWidth + columnOf[x];
			const w = a / 255;
			sums[i * 4] += r * w;
			sums[i * 4 + 1] += g * w;
			sums[i * 4 + 2] += b * w;
			sums[i * 4 + 3] += a;
			counts[i]++;
		}
		y++;
	};

	/** Undoes one row's filter (§9.2) into `current`, using `previous`. */
	const unfilter = (filter: number, raw: Uint8Array) => {
		for (let i = 0; i < rowBytes; i++) {
			const left = i >= bpp ? current[i - bpp] : 0;
			const up = previous[i];
			const upLeft = i >= bpp ? previous[i - bpp] : 0;
			let value = raw[i];
			if (filter === 1) value += left;
			else if (filter === 2) value += up;
			else if (filter === 3) value += (left + up) >> 1;
			else if (filter === 4) {
				const p = left + up - upLeft;
				const pa = Math.abs(p - left), pb = Math.abs(p - up), pc = Math.abs(p - upLeft);
				value += pa <= pb && pa <= pc ? left : pb <= pc ? up : upLeft;
			} else if (filter !== 0) throw new PngStripError(`row ${y + 1} has an unknown filter (${filter})`);
			current[i] = value & 0xff;
		}
	};

	await new Promise<void>((resolve, reject) => {
		const inflate = createInflate({ chunkSize: 64 * 1024 });
		inflate.on('data', (chunk: Buffer) => {
			let data: Uint8Array = chunk;
			if (pending.length) {
				const joined = new Uint8Array(pending.length + chunk.length);
				joined.set(pending);
				joined.set(chunk, pending.length);
				data = joined;
			}
			let offset = 0;
			try {
				while (y < height && data.length - offset >= rowBytes + 1) {
					unfilter(data[offset], data.subarray(offset + 1, offset + 1 + rowBytes));
					takeRow(current);
					[previous, current] = [current, previous];
					offset += rowBytes + 1;
				}
				// Exactly `height` filtered rows, no more: a file that holds more is not what its header says.
				if (y === height && offset < data.length)
					throw new PngStripError(`it holds more pixels than its ${width} × ${height} px header says`);
			} catch (e) {
				inflate.destroy();
				reject(e);
				return;
			}
			pending = data.slice(offset);
		});
		inflate.on('error', (e) => reject(new PngStripError(`its compressed data is damaged (${e.message})`)));
		inflate.on('end', () => resolve());
		for (const part of idat) inflate.write(part);
		inflate.end();
	});
	if (y < height) throw new PngStripError(`it holds ${y} of its ${height} rows`);

	const rgba = new Uint8Array(thumbWidth * thumbHeight * 4);
	for (let i = 0; i < counts.length; i++) {
		const n = counts[i] || 1;
		const a = sums[i * 4 + 3] / n;
		const k = a > 0 ? 255 / (a * n) : 0;
		rgba[i * 4] = Math.round(sums[i * 4] * k);
		rgba[i * 4 + 1] = Math.round(sums[i * 4 + 1] * k);
		rgba[i * 4 + 2] = Math.round(sums[i * 4 + 2] * k);
		rgba[i * 4 + 3] = Math.round(a);
	}
	return { widthPx: width, heightPx: height, rgba, thumbWidth, thumbHeight };
}
