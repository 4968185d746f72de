/**
 * Vector symbols drawn on cards: the runner symbols (so runners are told apart by shape, not by
 * colour alone) and the arrows and chevrons that show a move's direction.
 *
 * Each shape is defined in a unit square centred on the origin (−1..1) and returned as absolute
 * path data in face millimetres (M L C Z only), filled with the nonzero rule: holes (the ring)
 * are drawn as a reversed inner contour, which fills the same in SVG and PDF.
 */
import { RUNNER_SYMBOLS, type RunnerSymbol } from '../game/model';

export { RUNNER_SYMBOLS, type RunnerSymbol };

type Pt = readonly [number, number];

/** Bézier control distance for a quarter circle (the usual 4(√2−1)/3 approximation). */
const KAPPA = (4 * (Math.SQRT2 - 1)) / 3;

const f = (v: number) => `${Math.round(v * 1000) / 1000}`;

interface Place {
	cxMm: number;
	cyMm: number;
	/** Half the symbol's size: the unit square −1..1 maps to cx ± r. */
	rMm: number;
}

function polygon(points: readonly Pt[], p: Place): string {
	return (
		points
			.map(([x, y], i) => `${i === 0 ? 'M' : 'L'}${f(p.cxMm + x * p.rMm)} ${f(p.cyMm + y * p.rMm)}`)
			.join('') + 'Z'
	);
}

/** A circle of unit radius `r` as four cubic arcs, clockwise on screen unless `reverse`. */
function circle(r: number, p: Place, reverse = false): string {
	const cx = p.cxMm;
	const cy = p.cyMm;
	const R = r * p.rMm;
	const k = KAPPA * R;
	if (!reverse)
		return (
			`M${f(cx)} ${f(cy - R)}` +
			`C${f(cx + k)} ${f(cy - R)} ${f(cx + R)} ${f(cy - k)} ${f(cx + R)} ${f(cy)}` +
			`C${f(cx + R)} ${f(cy + k)} ${f(cx + k)} ${f(cy + R)} ${f(cx)} ${f(cy + R)}` +
			`C${f(cx - k)} ${f(cy + R)} ${f(cx - R)} ${f(cy + k)} ${f(cx - R)} ${f(cy)}` +
			`C${f(cx - R)} ${f(cy - k)} ${f(cx - k)} ${f(cy - R)} ${f(cx)} ${f(cy - R)}Z`
		);
	return (
		`M${f(cx)} ${f(cy - R)}` +
		`C${f(cx - k)} ${f(cy - R)} ${f(cx - R)} ${f(cy - k)} ${f(cx - R)} ${f(cy)}` +
		`C${f(cx - R)} ${f(cy + k)} ${f(cx - k)} ${f(cy + R)} ${f(cx)} ${f(cy + R)}` +
		`C${f(cx + k)} ${f(cy + R)} ${f(cx + R)} ${f(cy + k)} ${f(cx + R)} ${f(cy)}` +
		`C${f(cx + R)} ${f(cy - k)} ${f(cx + k)} ${f(cy - R)} ${f(cx)} ${f(cy - R)}Z`
	);
}

function star(points: number, outer: number, inner: number): Pt[] {
	const out: Pt[] = [];
	for (let i = 0; i < points * 2; i++) {
		const r = i % 2 === 0 ? outer : inner;
		const a = -Math.PI / 2 + (i * Math.PI) / points;
		out.push([r * Math.cos(a), r * Math.sin(a)]);
	}
	// Centre the star's box vertically (its lower points sit higher than its top point).
	const minY = Math.min(...out.map((p) => p[1]));
	const maxY = Math.max(...out.map((p) => p[1]));
	const dy = -(minY + maxY) / 2;
	return out.map(([x, y]) => [x, y + dy]);
}

const rect = (x0: number, y0: number, x1: number, y1: number): Pt[] => [
	[x0, y0],
	[x1, y0],
	[x1, y1],
	[x0, y1]
];

// Sizes are tuned by eye so every symbol carries about the same amount of ink at one size.
const SHAPES: Record<RunnerSymbol, (p: Place) => string> = {
	dot: (p) => circle(0.82, p),
	ring: (p) => circle(0.92, p) + circle(0.5, p, true),
	triangle: (p) =>
		polygon(
			[
				[0, -0.92],
				[1, 0.82],
				[-1, 0.82]
			],
			p
		),
	square: (p) => polygon(rect(-0.74, -0.74, 0.74, 0.74), p),
	diamond: (p) =>
		polygon(
			[
				[0, -1],
				[0.82, 0],
				[0, 1],
				[-0.82, 0]
			],
			p
		),
	star: (p) => polygon(star(5, 1.02, 0.45), p),
	cross: (p) => {
		const a = 0.3; // half the arm width
		const l = 0.92;
		return polygon(
			[
				[-a, -l],
				[a, -l],
				[a, -a],
				[l, -a],
				[l, a],
				[a, a],
				[a, l],
				[-a, l],
				[-a, a],
				[-l, a],
				[-l, -a],
				[-a, -a]
			],
			p
		);
	},
	bars: (p) =>
		[
			[-0.86, -0.5],
			[-0.17, 0.17],
			[0.5, 0.86]
		]
			.map(([y0, y1]) => polygon(rect(-0.9, y0, 0.9, y1), p))
			.join('')
};

/** Path data for a runner symbol centred at (cxMm, cyMm), `sizeMm` across. */
export function symbolPath(symbol: RunnerSymbol, cxMm: number, cyMm: number, sizeMm: number): string {
	return SHAPES[symbol]({ cxMm, cyMm, rMm: sizeMm / 2 });
}

export type Direction = 'forward' | 'back';

/**
 * A block arrow `lengthMm` long and `heightMm` tall centred at (cx, cy). Forward points right
 * (the way runners race on the card's track), back points left.
 */
export function arrowPath(direction: Direction, cxMm: number, cyMm: number, lengthMm: number, heightMm: number): string {
	const s = direction === 'forward' ? 1 : -1;
	const hl = lengthMm / 2;
	const head = Math.min(heightMm * 0.95, lengthMm * 0.55);
	const shaft = heightMm * 0.38;
	const pts: Pt[] = [
		[-hl, -shaft / 2],
		[hl - head, -shaft / 2],
		[hl - head, -heightMm / 2],
		[hl, 0],
		[hl - head, heightMm / 2],
		[hl - head, shaft / 2],
		[-hl, shaft / 2]
	];
	return polygon(
		pts.map(([x, y]) => [s * x, y]),
		{ cxMm, cyMm, rMm: 1 }
	);
}

/** A chevron (›) `widthMm` wide and `heightMm` tall centred at (cx, cy). */
export function chevronPath(direction: Direction, cxMm: number, cyMm: number, widthMm: number, heightMm: number): string {
	const s = direction === 'forward' ? 1 : -1;
	const hw = widthMm / 2;
	const hh = heightMm / 2;
	const t = widthMm * 0.5; // stroke thickness measured along x
	const pts: Pt[] = [
		[-hw, -hh],
		[-hw + t, -hh],
		[hw, 0],
		[-hw + t, hh],
		[-hw, hh],
		[hw - t, 0]
	];
	return polygon(
		pts.map(([x, y]) => [s * x, y]),
		{ cxMm, cyMm, rMm: 1 }
	);
}

/** Bounding box of absolute path data (control points included, so never too small). */
export function pathBounds(d: string): { x0: number; y0: number; x1: number; y1: number } | undefined {
	const nums = d.match(/-?\d*\.?\d+(?:e-?\d+)?/gi)?.map(Number) ?? [];
	// Our paths use only M L C Q Z with x y pairs (H and V would break the pairing).
	if (nums.length < 2 || /[HVhv]/.test(d)) return undefined;
	let x0 = Infinity,
		y0 = Infinity,
		x1 = -Infinity,
		y1 = -Infinity;
	for (let i = 0; i + 1 < nums.length; i += 2) {
		x0 = Math.min(x0, nums[i]);
		x1 = Math.max(x1, nums[i]);
		y0 = Math.min(y0, nums[i + 1]);
		y1 = Math.max(y1, nums[i + 1]);
	}
	return { x0, y0, x1, y1 };
}
