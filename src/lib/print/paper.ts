/**
 * Sheet sizes and the mm ↔ pt conversion every print module shares.
 *
 * PDF user space is 1/72 inch per unit by default (ISO 32000-1 §8.3.2.3), and an inch is
 * exactly 25.4 mm, so 1 mm = 72 / 25.4 pt ≈ 2.834646 pt.
 */
import { MM_PER_INCH } from '../game/model';

/** ISO 32000-1 §8.3.2.3: default user space unit is 1/72 inch. */
export const PT_PER_INCH = 72;
export const PT_PER_MM = PT_PER_INCH / MM_PER_INCH;

export const mmToPt = (mm: number) => mm * PT_PER_MM;
export const ptToMm = (pt: number) => pt / PT_PER_MM;
export const inchToMm = (inch: number) => inch * MM_PER_INCH;

export type PaperName = 'a4' | 'a3' | 'letter' | 'tabloid';

export interface PaperSize {
	/** Short side first: sizes are given portrait; imposition turns them. */
	widthMm: number;
	heightMm: number;
	label: string;
}

export const PAPER: Record<PaperName, PaperSize> = {
	// ISO 216 A series.
	a4: { widthMm: 210, heightMm: 297, label: 'A4' },
	a3: { widthMm: 297, heightMm: 420, label: 'A3' },
	// ANSI/ASME Y14.1: A size 8.5 × 11 in, B size 11 × 17 in.
	letter: { widthMm: inchToMm(8.5), heightMm: inchToMm(11), label: 'US Letter' },
	tabloid: { widthMm: inchToMm(11), heightMm: inchToMm(17), label: 'Tabloid' }
};

/** A named sheet or a custom one (any two sides in mm). */
export type PaperSpec = PaperName | { widthMm: number; heightMm: number; label?: string };

/** The sheet in portrait (short side as width), whatever order a custom size was given in. */
export function paperSize(spec: PaperSpec): PaperSize {
	if (typeof spec === 'string') {
		const known = PAPER[spec];
		if (!known) throw new Error(`unknown paper "${spec}"`);
		return known;
	}
	const { widthMm, heightMm } = spec;
	if (!(widthMm > 0 && heightMm > 0)) throw new Error('custom paper needs positive sides');
	return {
		widthMm: Math.min(widthMm, heightMm),
		heightMm: Math.max(widthMm, heightMm),
		label: spec.label ?? `${round1(widthMm)} × ${round1(heightMm)} mm`
	};
}

const round1 = (v: number) => Math.round(v * 10) / 10;
