/**
 * The outer layout of a PNG file, PNG spec (ISO/IEC 15948:2004) §5: the signature, then chunks.
 * Plain code with no imports, so the print workers read pixels and the upload checks read
 * headers with the same walk.
 */

/** PNG signature, §5.2. */
const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] as const;

export const isPng = (bytes: Uint8Array) => bytes.length >= PNG_SIGNATURE.length && PNG_SIGNATURE.every((b, i) => bytes[i] === b);

export interface PngChunk {
	/** The four-letter chunk type, e.g. `IHDR`. */
	type: string;
	/** The chunk's data (cut short when the file ends inside it). */
	data: Uint8Array;
	/** False when the file ends before the chunk's data does. */
	whole: boolean;
}

/**
 * The chunks in file order, §5.3: each is length (4 bytes, big-endian), type (4), data (length),
 * CRC (4). The walk ends at the end of the file or after a chunk the file cuts short; the caller
 * checks the signature.
 */
export function* pngChunks(bytes: Uint8Array): Generator<PngChunk> {
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	for (let at = PNG_SIGNATURE.length; at + 8 <= bytes.length; ) {
		const length = view.getUint32(at);
		const type = String.fromCharCode(bytes[at + 4], bytes[at + 5], bytes[at + 6], bytes[at + 7]);
		const start = at + 8;
		const whole = start + length <= bytes.length;
		yield { type, data: bytes.subarray(start, start + length), whole };
		if (!whole) return;
		at = start + length + 4;
	}
}

/** What decoding a PNG's pixels needs: the header's fields (§11.2.2) and the chunks that carry pixels. */
export interface PngParts {
	width: number;
	height: number;
	/** Bits per sample. */
	depth: number;
	/** Colour type (§11.2.2 Table 11.1). */
	colour: number;
	interlace: number;
	palette?: Uint8Array;
	/** The `tRNS` chunk. */
	transparency?: Uint8Array;
	/** The `IDAT` chunks' data, in order. */
	data: Uint8Array[];
	/** True when the file ends inside a chunk. */
	truncated: boolean;
}

/** §11.2.2: IHDR holds 13 bytes. */
const IHDR_BYTES = 13;

/**
 * The header and the pixel chunks; null when the signature is not a PNG's. A header shorter
 * than the spec's leaves the size at 0, which every reader refuses.
 */
export function readPngParts(bytes: Uint8Array): PngParts | null {
	if (!isPng(bytes)) return null;
	const png: PngParts = { width: 0, height: 0, depth: 0, colour: 0, interlace: 0, data: [], truncated: false };
	for (const { type, data, whole } of pngChunks(bytes)) {
		if (!whole) png.truncated = true;
		if (type === 'IHDR' && data.length >= IHDR_BYTES) {
			const view = new DataView(data.buffer, data.byteOffset, data.byteLength);
			png.width = view.getUint32(0);
			png.height = view.getUint32(4);
			png.depth = data[8];
			png.colour = data[9];
			png.interlace = data[12];
		} else if (type === 'PLTE') png.palette = data;
		else if (type === 'tRNS') png.transparency = data;
		else if (type === 'IDAT') png.data.push(data);
		else if (type === 'IEND') break;
	}
	return png;
}
