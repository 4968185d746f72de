/**
 * Legible ink on a coloured ground, by the relative luminance and contrast ratio of WCAG 2.1
 * (§1.4.3, definitions "relative luminance" and "contrast ratio"; sRGB per IEC 61966-2-1).
 */

function channel(v8: number): number {
	const c = v8 / 255;
	return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

export function relativeLuminance(hex: string): number {
	const m = /^#?([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
	if (!m) return 0;
	const [r, g, b] = [m[1], m[2], m[3]].map((h) => channel(parseInt(h, 16)));
	return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

export function contrastRatio(aHex: string, bHex: string): number {
	const a = relativeLuminance(aHex);
	const b = relativeLuminance(bHex);
	return (Math.max(a, b) + 0.05) / (Math.min(a, b) + 0.05);
}

/** Whichever candidate reads best on `groundHex`. */
export function readableOn(groundHex: string, ...candidates: string[]): string {
	return candidates.reduce((best, c) => (contrastRatio(groundHex, c) > contrastRatio(groundHex, best) ? c : best));
}

/** Mix a colour toward black (amount > 0) or white (amount < 0), for pattern tones. */
export function shade(hex: string, amount: number): string {
	const m = /^#?([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
	if (!m) return hex;
	const target = amount >= 0 ? 0 : 255;
	const t = Math.abs(amount);
	return (
		'#' +
		[m[1], m[2], m[3]]
			.map((h) => Math.round(parseInt(h, 16) * (1 - t) + target * t))
			.map((v) => v.toString(16).padStart(2, '0'))
			.join('')
	);
}

/** WCAG 2.1 §1.4.3: 4.5:1 for body text. */
export const TEXT_CONTRAST_MIN = 4.5;

/**
 * `fgHex` itself if it reads on `groundHex`, else the same hue darkened (or lightened, on a dark
 * ground) just enough to reach `minRatio`: a designer's pale accent stays recognisable as text.
 */
export function legibleOn(fgHex: string, groundHex: string, minRatio = TEXT_CONTRAST_MIN): string {
	if (contrastRatio(fgHex, groundHex) >= minRatio) return fgHex;
	const towardBlack = relativeLuminance(groundHex) > 0.18;
	for (let t = 0.05; t <= 1.0001; t += 0.05) {
		const c = shade(fgHex, towardBlack ? t : -t);
		if (contrastRatio(c, groundHex) >= minRatio) return c;
	}
	return towardBlack ? '#000000' : '#ffffff';
}
