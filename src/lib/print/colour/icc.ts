/**
 * ICC profile headers (ICC.1:2010 §7.2, the same layout in ICC v2 and v4): the first 128 bytes say
 * how long the profile is, what kind of device it describes and its colour spaces. A press profile
 * must be an output profile (`prtr`) for CMYK with Lab or XYZ as its connection space; anything
 * else is refused before the colour engine ever opens it.
 */

/**
 * Largest ICC profile accepted. Press profiles are usually 0.5–3 MB (from memory: the common
 * FOGRA and GRACoL profiles are about 1–2 MB); twice the largest we know of leaves room.
 */
export const ICC_MAX_BYTES = 8 * 1024 * 1024;
/** Header (128 bytes) plus the tag count (4): nothing shorter is a profile (ICC.1:2010 §7.1). */
const ICC_MIN_BYTES = 132;

export class IccError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'IccError';
	}
}

export interface IccHeader {
	/** Declared size in bytes (bytes 0–3). */
	sizeBytes: number;
	/** e.g. "2.2" or "4.3" (byte 8 major, byte 9 minor in its high nibble). */
	version: string;
	/** Profile/device class signature (bytes 12–15): `prtr` for output devices. */
	deviceClass: string;
	/** Data colour space (bytes 16–19): `CMYK` for a press. */
	colourSpace: string;
	/** Profile connection space (bytes 20–23): `Lab ` or `XYZ `. */
	pcs: string;
	/** Bytes 36–39, always `acsp`. */
	signature: string;
	/** Rendering intent the profile prefers (bytes 64–67): 0 perceptual, 1 relative, 2 saturation, 3 absolute. */
	renderingIntent: number;
}

const sig = (bytes: Uint8Array, at: number) => String.fromCharCode(bytes[at], bytes[at + 1], bytes[at + 2], bytes[at + 3]);

/** Reads the header; throws IccError when the bytes are not an ICC profile at all. */
export function readIccHeader(bytes: Uint8Array): IccHeader {
	if (bytes.length < ICC_MIN_BYTES) throw new IccError(`The file is ${bytes.length} bytes: too short to be an ICC profile`);
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const header: IccHeader = {
		sizeBytes: view.getUint32(0),
		version: `${bytes[8]}.${bytes[9] >> 4}`,
		deviceClass: sig(bytes, 12),
		colourSpace: sig(bytes, 16),
		pcs: sig(bytes, 20),
		signature: sig(bytes, 36),
		renderingIntent: view.getUint32(64)
	};
	if (header.signature !== 'acsp') throw new IccError('The file is not an ICC profile (no “acsp” signature in its header)');
	return header;
}

/**
 * Checks that the bytes are a CMYK output profile Paddock can embed as a PDF/X output intent.
 * Returns the header; every refusal says what was found.
 */
export function checkPressProfile(bytes: Uint8Array): IccHeader {
	if (bytes.length > ICC_MAX_BYTES)
		throw new IccError(`The profile is ${(bytes.length / 1048576).toFixed(1)} MB; press profiles up to ${ICC_MAX_BYTES / 1048576} MB are accepted`);
	const h = readIccHeader(bytes);
	if (h.sizeBytes !== bytes.length)
		throw new IccError(`The profile says it is ${h.sizeBytes} bytes long but the file has ${bytes.length}: it is cut short or padded`);
	if (![2, 4].includes(bytes[8])) throw new IccError(`ICC version ${h.version} is not one PDF/X knows (versions 2 and 4 are)`);
	if (h.deviceClass !== 'prtr')
		throw new IccError(`This is a ${describeClass(h.deviceClass)} profile; a press needs an output profile (device class “prtr”)`);
	if (h.colourSpace !== 'CMYK') throw new IccError(`This profile is for ${h.colourSpace.trim()} data; a press profile is for CMYK`);
	if (h.pcs !== 'Lab ' && h.pcs !== 'XYZ ') throw new IccError(`Unknown connection space “${h.pcs.trim()}” (Lab or XYZ expected)`);
	return h;
}

function describeClass(c: string): string {
	const names: Record<string, string> = {
		scnr: 'input (scanner or camera)',
		mntr: 'display',
		link: 'device link',
		spac: 'colour space',
		abst: 'abstract',
		nmcl: 'named colour'
	};
	return names[c] ?? `“${c}”`;
}
