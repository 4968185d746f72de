/**
 * The runner symbols as path outlines, so every backend draws the same shape beside a runner's
 * colour (the game must work for colour-blind players).
 *
 * Paths use absolute M, L, C and Z only, filled with the nonzero rule: holes (the ring) are drawn
 * as an inner outline in the opposite direction.
 */
import type { RunnerSymbol } from './model';

/** Bézier handle length for a quarter circle: 4/3 · (√2 − 1). */
const KAPPA = 0.5522847498;

const n = (v: number) => (Math.round(v * 1000) / 1000).toString();

function circle(cx: number, cy: number, r: number, clockwise = true): string {
	const k = r * KAPPA;
	if (clockwise)
		return (
			`M${n(cx)} ${n(cy - r)}` +
			`C${n(cx + k)} ${n(cy - r)} ${n(cx + r)} ${n(cy - k)} ${n(cx + r)} ${n(cy)}` +
			`C${n(cx + r)} ${n(cy + k)} ${n(cx + k)} ${n(cy + r)} ${n(cx)} ${n(cy + r)}` +
			`C${n(cx - k)} ${n(cy + r)} ${n(cx - r)} ${n(cy + k)} ${n(cx - r)} ${n(cy)}` +
			`C${n(cx - r)} ${n(cy - k)} ${n(cx - k)} ${n(cy - r)} ${n(cx)} ${n(cy - r)}Z`
		);
	return (
		`M${n(cx)} ${n(cy - r)}` +
		`C${n(cx - k)} ${n(cy - r)} ${n(cx - r)} ${n(cy - k)} ${n(cx - r)} ${n(cy)}` +
		`C${n(cx - r)} ${n(cy + k)} ${n(cx - k)} ${n(cy + r)} ${n(cx)} ${n(cy + r)}` +
		`C${n(cx + k)} ${n(cy + r)} ${n(cx + r)} ${n(cy + k)} ${n(cx + r)} ${n(cy)}` +
		`C${n(cx + r)} ${n(cy - k)} ${n(cx + k)} ${n(cy - r)} ${n(cx)} ${n(cy - r)}Z`
	);
}

function polygon(points: [number, number][]): string {
	return points.map(([x, y], i) => `${i === 0 ? 'M' : 'L'}${n(x)} ${n(y)}`).join('') + 'Z';
}

/**
 * Outline of `symbol` centred on (cx, cy), fitting a square of side `size` (any unit:
 * mm for layouts, px or viewBox units for art).
 */
export function symbolPath(symbol: RunnerSymbol, cx: number, cy: number, size: number): string {
	const h = size / 2;
	switch (symbol) {
		case 'dot':
			return circle(cx, cy, h * 0.8);
		case 'ring':
			return circle(cx, cy, h * 0.9) + circle(cx, cy, h * 0.5, false);
		case 'square':
			return polygon([
				[cx - h * 0.8, cy - h * 0.8],
				[cx + h * 0.8, cy - h * 0.8],
				[cx + h * 0.8, cy + h * 0.8],
				[cx - h * 0.8, cy + h * 0.8]
			]);
		case 'diamond':
			return polygon([
				[cx, cy - h],
				[cx + h * 0.8, cy],
				[cx, cy + h],
				[cx - h * 0.8, cy]
			]);
		case 'triangle':
			return polygon([
				[cx, cy - h * 0.95],
				[cx + h, cy + h * 0.8],
				[cx - h, cy + h * 0.8]
			]);
		case 'star': {
			const pts: [number, number][] = [];
			for (let i = 0; i < 10; i++) {
				const r = i % 2 === 0 ? h : h * 0.42;
				const a = -Math.PI / 2 + (i * Math.PI) / 5;
				pts.push([cx + r * Math.cos(a), cy + r * Math.sin(a) + h * 0.06]);
			}
			return polygon(pts);
		}
		case 'cross': {
			const t = h * 0.3;
			return polygon([
				[cx - t, cy - h],
				[cx + t, cy - h],
				[cx + t, cy - t],
				[cx + h, cy - t],
				[cx + h, cy + t],
				[cx + t, cy + t],
				[cx + t, cy + h],
				[cx - t, cy + h],
				[cx - t, cy + t],
				[cx - h, cy + t],
				[cx - h, cy - t],
				[cx - t, cy - t]
			]);
		}
		case 'bars': {
			const w = size * 0.18;
			const gap = size * 0.12;
			return [-1, 0, 1]
				.map((i) => {
					const x = cx + i * (w + gap) - w / 2;
					return polygon([
						[x, cy - h * 0.85],
						[x + w, cy - h * 0.85],
						[x + w, cy + h * 0.85],
						[x, cy + h * 0.85]
					]);
				})
				.join('');
		}
	}
}
