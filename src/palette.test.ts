/**
 * The text colour pairs of the app's palette meet WCAG 2.x level AA contrast: 4.5:1 for normal
 * text (Success Criterion 1.4.3, Contrast (Minimum)). Ratios by culori's wcagContrast, which
 * implements the WCAG 2.x relative-luminance formula.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { wcagContrast } from 'culori';

const css = readFileSync(new URL('./app.css', import.meta.url), 'utf8');
const palette = Object.fromEntries([...css.matchAll(/--color-([a-z0-9-]+):\s*(#[0-9a-f]{6})/gi)].map((m) => [m[1], m[2]]));
const colour = (name: string) => (name === 'white' ? '#ffffff' : (palette[name] ?? name));

/** [text, background]: every pairing the pages use for words. */
const PAIRS: [string, string][] = [
	['rail', 'rail-100'], // placeholder pills, warnings, "removed" pills
	['rail', 'white'],
	['rail', 'paper'],
	['white', 'rail'], // danger buttons
	['chalk', 'turf-700'],
	['turf-700', 'paper'],
	['turf-700', 'white'],
	['turf-700', 'turf-50'],
	['turf-900', 'turf-100'],
	['ink', 'paper'],
	['ink', 'rosette-100'],
	['ink', 'rail-100'],
	['ink-soft', 'paper'],
	['ink-soft', 'white'],
	['ink-soft', 'turf-50'],
	['ink-soft', 'chalk']
];

describe('palette contrast (WCAG 2.x SC 1.4.3, AA: 4.5:1 for normal text)', () => {
	it('reads every colour of the pairs from the stylesheet', () => {
		for (const [text, background] of PAIRS) {
			expect(colour(text), text).toMatch(/^#[0-9a-f]{6}$/i);
			expect(colour(background), background).toMatch(/^#[0-9a-f]{6}$/i);
		}
	});
	it.each(PAIRS)('%s text on %s is at least 4.5:1', (text, background) => {
		expect(wcagContrast(colour(text), colour(background))).toBeGreaterThanOrEqual(4.5);
	});
	it('the rust-red pair that measured 4.18:1 before is now above the bar', () => {
		expect(wcagContrast('#b5452c', '#f7dcd3')).toBeLessThan(4.5);
		expect(wcagContrast(colour('rail'), colour('rail-100'))).toBeGreaterThan(5);
	});
});
