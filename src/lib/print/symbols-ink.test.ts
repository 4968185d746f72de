import { Resvg } from '@resvg/resvg-wasm';
import { describe, expect, it } from 'vitest';
import { resvgReady } from './png';
import { RUNNER_SYMBOLS } from '../game/model';
import { symbolPath } from './symbols';

/** Renders one symbol in a 100 × 100 box and counts inked pixels inside and outside its square. */
async function ink(symbol: (typeof RUNNER_SYMBOLS)[number]) {
	await resvgReady();
	const svg = `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 100 100" width="100" height="100"><rect width="100" height="100" fill="#fff"/><path d="${symbolPath(symbol, 50, 50, 60)}" fill="#000"/></svg>`;
	const r = new Resvg(svg, { font: { loadSystemFonts: false } });
	const img = r.render();
	const px = img.pixels;
	let inside = 0;
	let outside = 0;
	let centre = 0;
	for (let y = 0; y < 100; y++)
		for (let x = 0; x < 100; x++) {
			const dark = px[(y * 100 + x) * 4] < 128;
			if (!dark) continue;
			if (x >= 19 && x <= 81 && y >= 19 && y <= 81) inside++;
			else outside++;
			if (x === 50 && y === 50) centre++;
		}
	img.free();
	r.free();
	return { inside, outside, centre };
}

describe('runner symbols', () => {
	it.each(RUNNER_SYMBOLS)('%s draws ink within its square only', async (symbol) => {
		const { inside, outside } = await ink(symbol);
		expect(inside).toBeGreaterThan(300);
		expect(outside).toBe(0);
	});
	it('the ring has a hole and the dot has none', async () => {
		expect((await ink('ring')).centre).toBe(0);
		expect((await ink('dot')).centre).toBe(1);
	});
	it('uses only absolute M, L, C and Z commands', () => {
		for (const s of RUNNER_SYMBOLS) expect(symbolPath(s, 10, 10, 8)).toMatch(/^[MLCZ0-9. -]+$/);
	});
	it('every symbol has a different outline', () => {
		expect(new Set(RUNNER_SYMBOLS.map((s) => symbolPath(s, 0, 0, 10))).size).toBe(RUNNER_SYMBOLS.length);
	});
});
