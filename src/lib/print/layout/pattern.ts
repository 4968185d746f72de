/**
 * Patterns as plain paths that stay inside their box (imposition does not clip a face, so
 * nothing may spill onto the neighbouring card).
 */
import { symbolPath, RUNNER_SYMBOLS, type RunnerSymbol } from '../symbols';
import type { Box } from './face-builder';

type Pt = [number, number];

/** Clip a convex polygon to an axis-aligned box (Sutherland–Hodgman, one edge at a time). */
export function clipToBox(poly: Pt[], box: Box): Pt[] {
	const edges: [(p: Pt) => boolean, (a: Pt, b: Pt) => Pt][] = [];
	const x0 = box.xMm,
		x1 = box.xMm + box.wMm,
		y0 = box.yMm,
		y1 = box.yMm + box.hMm;
	const atX = (x: number) => (a: Pt, b: Pt): Pt => [x, a[1] + ((b[1] - a[1]) * (x - a[0])) / (b[0] - a[0])];
	const atY = (y: number) => (a: Pt, b: Pt): Pt => [a[0] + ((b[0] - a[0]) * (y - a[1])) / (b[1] - a[1]), y];
	edges.push([(p) => p[0] >= x0, atX(x0)], [(p) => p[0] <= x1, atX(x1)], [(p) => p[1] >= y0, atY(y0)], [(p) => p[1] <= y1, atY(y1)]);
	let out = poly;
	for (const [inside, cut] of edges) {
		const input = out;
		out = [];
		for (let i = 0; i < input.length; i++) {
			const cur = input[i];
			const prev = input[(i + input.length - 1) % input.length];
			if (inside(cur)) {
				if (!inside(prev)) out.push(cut(prev, cur));
				out.push(cur);
			} else if (inside(prev)) out.push(cut(prev, cur));
		}
		if (out.length === 0) break;
	}
	return out;
}

const f = (v: number) => `${Math.round(v * 1000) / 1000}`;
const toPath = (poly: Pt[]) => poly.map(([x, y], i) => `${i ? 'L' : 'M'}${f(x)} ${f(y)}`).join('') + 'Z';

/** Diagonal stripes (rising left to right) across a box, `widthMm` wide every `periodMm`. */
export function stripesPath(box: Box, periodMm: number, widthMm: number): string {
	const parts: string[] = [];
	const h = box.hMm;
	for (let x = box.xMm - h; x < box.xMm + box.wMm; x += periodMm) {
		const poly: Pt[] = [
			[x, box.yMm + h],
			[x + widthMm, box.yMm + h],
			[x + widthMm + h, box.yMm],
			[x + h, box.yMm]
		];
		const clipped = clipToBox(poly, box);
		if (clipped.length >= 3) parts.push(toPath(clipped));
	}
	return parts.join('');
}

/**
 * A staggered lattice of symbols centred on `box` (so it sits the same on every copy), cycling
 * through `symbols`; only whole symbols that fit inside the box are drawn.
 */
export function symbolLatticePath(
	box: Box,
	symbolMm: number,
	pitchMm: number,
	symbols: readonly RunnerSymbol[] = RUNNER_SYMBOLS
): string {
	const parts: string[] = [];
	const cx = box.xMm + box.wMm / 2;
	const cy = box.yMm + box.hMm / 2;
	const rowPitch = pitchMm * 0.866; // equilateral stagger: rows √3/2 apart
	const rows = Math.ceil(box.hMm / rowPitch / 2) + 1;
	const cols = Math.ceil(box.wMm / pitchMm / 2) + 1;
	const r = symbolMm / 2;
	for (let j = -rows; j <= rows; j++) {
		const y = cy + j * rowPitch;
		const offset = Math.abs(j) % 2 === 1 ? pitchMm / 2 : 0;
		for (let i = -cols; i <= cols; i++) {
			const x = cx + i * pitchMm + offset;
			if (x - r < box.xMm || x + r > box.xMm + box.wMm || y - r < box.yMm || y + r > box.yMm + box.hMm) continue;
			const k = (((i + j * 3) % symbols.length) + symbols.length) % symbols.length;
			parts.push(symbolPath(symbols[k], x, y, symbolMm));
		}
	}
	return parts.join('');
}
