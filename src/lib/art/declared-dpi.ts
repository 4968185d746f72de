/**
 * The resolution a raster file declares for itself (what the artist's program wrote), as dots
 * per inch. This is only a label: the resolution that prints depends on the slot the art fills,
 * which `checkArtResolution` in ../game/art-check.ts works out. Absent or unit-less → undefined.
 */
import exifr from 'exifr';
import { MM_PER_INCH } from '../game/model';
import { pngChunks } from './png-chunks';

export interface DeclaredDpi {
	dpiX: number;
	dpiY: number;
}

/** Millimetres per metre, for pixels-per-metre → dots-per-inch. */
const MM_PER_M = 1000;

/**
 * PNG `pHYs` chunk, PNG spec (ISO/IEC 15948:2004) §11.3.5.3: pixels per unit X (4 bytes),
 * pixels per unit Y (4 bytes), unit specifier (1 byte: 0 = unknown, aspect ratio only; 1 = metre).
 * §5.6: pHYs must come before the first IDAT, so the walk stops there.
 */
export function pngDeclaredDpi(bytes: Uint8Array): DeclaredDpi | undefined {
	for (const chunk of pngChunks(bytes)) {
		if (chunk.type === 'IDAT' || chunk.type === 'IEND' || !chunk.whole) return undefined;
		if (chunk.type === 'pHYs') {
			const { data } = chunk;
			if (data.length !== 9) return undefined;
			const view = new DataView(data.buffer, data.byteOffset, data.byteLength);
			const ppuX = view.getUint32(0);
			const ppuY = view.getUint32(4);
			const unit = data[8];
			if (unit !== 1 || ppuX === 0 || ppuY === 0) return undefined;
			return { dpiX: (ppuX * MM_PER_INCH) / MM_PER_M, dpiY: (ppuY * MM_PER_INCH) / MM_PER_M };
		}
	}
	return undefined;
}

/** Millimetres per centimetre, for dots-per-cm units. */
const MM_PER_CM = 10;

/**
 * JPEG: the TIFF/EXIF IFD0 resolution (TIFF 6.0 §"ResolutionUnit": 1 = no absolute unit,
 * 2 = inch, the default when the tag is absent, 3 = centimetre) and the JFIF APP0 density
 * (JFIF 1.02: units 0 = aspect ratio only, 1 = dots per inch, 2 = dots per cm).
 * The two codes disagree (2 is inch in TIFF, cm in JFIF), so the blocks are read apart and
 * untranslated. When both declare a real unit, EXIF wins: it is what image editors rewrite when
 * the artist sets a print size, while JFIF density is often left as the encoder's default.
 */
export async function jpegDeclaredDpi(bytes: Uint8Array): Promise<DeclaredDpi | undefined> {
	let parsed: Record<string, Record<string, unknown> | undefined> | undefined;
	try {
		parsed = await exifr.parse(bytes, {
			jfif: true,
			tiff: true,
			ifd1: false,
			exif: false,
			gps: false,
			interop: false,
			xmp: false,
			icc: false,
			iptc: false,
			mergeOutput: false,
			translateValues: false
		});
	} catch {
		// A damaged metadata block only means no declared resolution.
		return undefined;
	}
	const ifd0 = parsed?.ifd0;
	if (ifd0) {
		const unit = ifd0.ResolutionUnit ?? 2;
		const perInch = unit === 2 ? 1 : unit === 3 ? MM_PER_INCH / MM_PER_CM : undefined;
		const dpi = perInch && both(ifd0.XResolution, ifd0.YResolution, perInch);
		if (dpi) return dpi;
	}
	const jfif = parsed?.jfif;
	if (jfif) {
		const unit = jfif.ResolutionUnit;
		const perInch = unit === 1 ? 1 : unit === 2 ? MM_PER_INCH / MM_PER_CM : undefined;
		const dpi = perInch && both(jfif.XResolution, jfif.YResolution, perInch);
		if (dpi) return dpi;
	}
	return undefined;
}

function both(x: unknown, y: unknown, perInch: number): DeclaredDpi | undefined {
	if (typeof x !== 'number' || typeof y !== 'number' || !(x > 0) || !(y > 0)) return undefined;
	if (!Number.isFinite(x) || !Number.isFinite(y)) return undefined;
	return { dpiX: x * perInch, dpiY: y * perInch };
}
