import { describe, expect, it } from 'vitest';
import { contrastRatio, legibleOn, readableOn, relativeLuminance } from './contrast';

describe('contrast (WCAG 2.1 relative luminance and contrast ratio)', () => {
	it('matches the definition’s end points and a known figure', () => {
		expect(relativeLuminance('#000000')).toBe(0);
		expect(relativeLuminance('#ffffff')).toBeCloseTo(1, 12);
		// Black on white is 21:1 by the definition ((1 + 0.05) / (0 + 0.05)).
		expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 9);
		// #777777 on white is about 4.48:1, just under AA for body text (a commonly quoted example).
		expect(contrastRatio('#777777', '#ffffff')).toBeCloseTo(4.48, 2);
	});

	it('picks the ink that reads best on a ground', () => {
		expect(readableOn('#f2c230', '#1d2327', '#ffffff')).toBe('#1d2327');
		expect(readableOn('#24473c', '#1d2327', '#ffffff')).toBe('#ffffff');
	});

	it('darkens a pale accent just enough to reach 4.5:1, and keeps a good one', () => {
		const paper = '#f7f3ea';
		expect(legibleOn('#1d2327', paper)).toBe('#1d2327');
		const gold = legibleOn('#d9a441', paper);
		expect(gold).not.toBe('#d9a441');
		expect(contrastRatio(gold, paper)).toBeGreaterThanOrEqual(4.5);
		// Lightened on a dark ground.
		expect(contrastRatio(legibleOn('#2e5e4e', '#102018'), '#102018')).toBeGreaterThanOrEqual(4.5);
	});
});
