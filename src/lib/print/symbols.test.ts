import { describe, expect, it } from 'vitest';
import { RUNNER_SYMBOLS as MODEL_SYMBOLS } from '../game/model';
import { arrowPath, chevronPath, pathBounds, RUNNER_SYMBOLS, symbolPath } from './symbols';

describe('symbols', () => {
	it('draws every runner symbol the game model allows', () => {
		expect(RUNNER_SYMBOLS).toEqual(MODEL_SYMBOLS);
		const paths = RUNNER_SYMBOLS.map((s) => symbolPath(s, 20, 30, 10));
		// Each symbol is its own shape (told apart without colour).
		expect(new Set(paths).size).toBe(RUNNER_SYMBOLS.length);
		for (const d of paths) {
			// Only absolute M L C Z, as the display list allows for every backend.
			expect(d).toMatch(/^M[-\d. MLCZ]+$/);
			const b = pathBounds(d)!;
			expect(b.x0).toBeGreaterThanOrEqual(15 - 0.11);
			expect(b.x1).toBeLessThanOrEqual(25 + 0.11);
			expect(b.y0).toBeGreaterThanOrEqual(25 - 0.11);
			expect(b.y1).toBeLessThanOrEqual(35 + 0.11);
		}
	});

	it('the ring has a hole: its inner contour runs the other way (nonzero fill)', () => {
		const d = symbolPath('ring', 0, 0, 10);
		expect(d.match(/M/g)).toHaveLength(2);
	});

	it('arrows and chevrons point the way asked', () => {
		const fwd = pathBounds(arrowPath('forward', 0, 0, 20, 8))!;
		expect([fwd.x0, fwd.x1, fwd.y0, fwd.y1]).toEqual([-10, 10, -4, 4]);
		// The tip is the point at x = +10 going forward and at x = −10 going back.
		expect(arrowPath('forward', 0, 0, 20, 8)).toContain('L10 0');
		expect(arrowPath('back', 0, 0, 20, 8)).toContain('L-10 0');
		expect(chevronPath('forward', 0, 0, 4, 6)).toContain('L2 0');
		expect(chevronPath('back', 0, 0, 4, 6)).toContain('L-2 0');
	});
});
