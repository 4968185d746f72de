/**
 * Art checks: the resolution an image will really print at in its slot.
 *
 * effective dpi = pixels / (printed mm / 25.4). Under 300 dpi the print may look soft;
 * 300 dpi is common practice for printed cards, not a standard.
 */
import { bleedMm, MM_PER_INCH, type ArtAsset, type BleedStandard, type CardSize } from './model';

/** Common practice for offset and digital card printing. */
export const MIN_PRINT_DPI = 300;

export interface SlotMm {
	widthMm: number;
	heightMm: number;
}

/** The resolution figure people see, on every page and in every file: whole dpi, rounded down (never claim more than there is). */
export const shownDpi = (dpi: number) => Math.floor(dpi);

/** Dots per inch when `px` pixels print across `mm` millimetres. */
export function effectiveDpi(px: number, mm: number): number {
	if (!(mm > 0)) throw new Error('A printed size must be more than 0 mm');
	return px / (mm / MM_PER_INCH);
}

/** Pixels needed to print `mm` millimetres at `dpi` (rounded up, tiny float error forgiven). */
export function pxForPrint(mm: number, dpi = MIN_PRINT_DPI): number {
	return Math.ceil((mm / MM_PER_INCH) * dpi - 1e-9);
}

/** The printed face of a card including bleed on every side: what full-bleed art must cover. */
export function faceWithBleedMm(size: Pick<CardSize, 'widthMm' | 'heightMm'>, standard: BleedStandard): SlotMm {
	const b = bleedMm(standard);
	return { widthMm: size.widthMm + 2 * b, heightMm: size.heightMm + 2 * b };
}

export interface ArtResolution {
	dpiX: number;
	dpiY: number;
	/**
	 * The resolution that prints: art scaled to cover its slot is stretched by the tighter
	 * axis, so this is the smaller of dpiX and dpiY ('cover'), or the larger for 'contain'.
	 */
	dpi: number;
	ok: boolean;
	/** Pixel size that would reach the minimum in this slot. */
	neededPx: { widthPx: number; heightPx: number };
	/** Image aspect ÷ slot aspect; far from 1 means cropping ('cover') or empty margins ('contain'). */
	aspectRatio: number;
	warnings: string[];
}

export function checkArtResolution(
	image: { widthPx: number; heightPx: number; mime?: ArtAsset['mime'] },
	slot: SlotMm,
	options: { fit?: 'cover' | 'contain'; minDpi?: number } = {}
): ArtResolution {
	const fit = options.fit ?? 'cover';
	const minDpi = options.minDpi ?? MIN_PRINT_DPI;
	const dpiX = effectiveDpi(image.widthPx, slot.widthMm);
	const dpiY = effectiveDpi(image.heightPx, slot.heightMm);
	const dpi = fit === 'cover' ? Math.min(dpiX, dpiY) : Math.max(dpiX, dpiY);
	const aspectRatio = image.widthPx / image.heightPx / (slot.widthMm / slot.heightMm);
	const vector = image.mime === 'image/svg+xml';
	const warnings: string[] = [];
	const ok = vector || dpi >= minDpi - 1e-9;
	if (!ok)
		warnings.push(
			`Prints at ${shownDpi(dpi)} dpi in a ${fmt(slot.widthMm)} × ${fmt(slot.heightMm)} mm slot; ` +
				`${minDpi} dpi needs ${pxForPrint(slot.widthMm, minDpi)} × ${pxForPrint(slot.heightMm, minDpi)} px`
		);
	if (Math.abs(aspectRatio - 1) > 0.02)
		warnings.push(
			fit === 'cover'
				? `The image's shape differs from the slot's: ${Math.round(Math.abs(1 - Math.min(aspectRatio, 1 / aspectRatio)) * 100)}% will be cropped`
				: `The image's shape differs from the slot's: it will not fill the slot`
		);
	return {
		dpiX,
		dpiY,
		dpi,
		ok,
		neededPx: { widthPx: pxForPrint(slot.widthMm, minDpi), heightPx: pxForPrint(slot.heightMm, minDpi) },
		aspectRatio,
		warnings
	};
}

const fmt = (mm: number) => (Math.round(mm * 100) / 100).toString();
