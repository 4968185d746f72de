import { beforeAll, describe, expect, it } from 'vitest';
import { demoGame } from '../demo/demo';
import { loadFonts, type FontSet } from './fonts';
import { fitText, fitTitle, measureTextMm, MM_PER_PT, textLine, wrapText, type TextBox } from './text';

let fonts: FontSet;
beforeAll(async () => {
	fonts = await loadFonts();
});

const ink = { hex: '#000000' };

/** Width straight from fontkit, in mm (1 pt = 1/72 in, 1 in = 25.4 mm: ISO 32000-1 §8.3.2.3). */
function fontkitWidthMm(weight: 'regular' | 'bold', text: string, sizePt: number) {
	const f = fonts[weight].metrics;
	return (f.layout(text).advanceWidth / f.unitsPerEm) * sizePt * (25.4 / 72);
}

/** Every line inside the box: widths by fontkit, and the line boxes (ascent/descent) inside its height. */
function expectInside(items: ReturnType<typeof fitText>['items'], box: TextBox) {
	for (const item of items) {
		const f = fonts[item.weight].metrics;
		const em = item.sizePt * (25.4 / 72);
		const w = fontkitWidthMm(item.weight, item.text, item.sizePt);
		expect(item.xMm).toBeGreaterThanOrEqual(box.xMm - 1e-6);
		expect(item.xMm + w).toBeLessThanOrEqual(box.xMm + box.wMm + 1e-6);
		expect(item.yMm - (f.ascent / f.unitsPerEm) * em).toBeGreaterThanOrEqual(box.yMm - 1e-6);
		expect(item.yMm - (f.descent / f.unitsPerEm) * em).toBeLessThanOrEqual(box.yMm + box.hMm + 1e-6);
	}
}

describe('measureTextMm', () => {
	it('uses the font’s advance widths and the PostScript point', () => {
		// 72 pt = 1 in = 25.4 mm (ISO 32000-1 §8.3.2.3, user space unit 1/72 in).
		expect(MM_PER_PT * 72).toBeCloseTo(25.4, 12);
		const f = fonts.regular.metrics;
		// Sum of glyph advances for a string without kerning pairs, read from the glyphs themselves.
		const glyphUnits = f.glyphsForString('1111').reduce((s, g) => s + g.advanceWidth, 0);
		expect(measureTextMm(f, '1111', 10)).toBeCloseTo((glyphUnits / f.unitsPerEm) * 10 * (25.4 / 72), 9);
		expect(measureTextMm(f, 'Hedgerow', 12)).toBeCloseTo(fontkitWidthMm('regular', 'Hedgerow', 12), 9);
		// Linear in size.
		expect(measureTextMm(f, 'Hedgerow', 24)).toBeCloseTo(2 * measureTextMm(f, 'Hedgerow', 12), 9);
	});
});

describe('wrapText', () => {
	it('breaks at spaces and keeps every line within the width', () => {
		const f = fonts.regular.metrics;
		const text = 'When the shared deck runs out, pay out every stage wager, then shuffle and deal again.';
		const { lines, brokeWord } = wrapText(f, text, 9, 30);
		expect(brokeWord).toBe(false);
		expect(lines.length).toBeGreaterThan(2);
		expect(lines.join(' ')).toBe(text);
		for (const l of lines) expect(fontkitWidthMm('regular', l, 9)).toBeLessThanOrEqual(30);
	});

	it('cuts a word wider than the line between letters', () => {
		const f = fonts.regular.metrics;
		const word = 'Slimetrailmeisterschaftsgewinner';
		const { lines, brokeWord } = wrapText(f, word, 10, 15);
		expect(brokeWord).toBe(true);
		expect(lines.join('')).toBe(word);
		for (const l of lines) expect(fontkitWidthMm('regular', l, 10)).toBeLessThanOrEqual(15);
	});

	it('keeps the text’s own line breaks', () => {
		expect(wrapText(fonts.regular.metrics, 'one\ntwo', 10, 100).lines).toEqual(['one', 'two']);
	});
});

describe('fitText', () => {
	const box: TextBox = { xMm: 10, yMm: 20, wMm: 40, hMm: 12 };

	it('keeps a short name at the largest size', () => {
		const r = fitText(fonts, 'Moss', box, { maxPt: 16, minPt: 8, weight: 'bold', fill: ink });
		expect(r.sizePt).toBe(16);
		expect(r.lines).toEqual(['Moss']);
		expect(r.warning).toBeUndefined();
		expectInside(r.items, box);
	});

	it('shrinks a long name until it fits, wrapping at spaces', () => {
		const name = 'Periwinkle the Unhurried of Lower Hedgebottom';
		const r = fitText(fonts, name, box, { maxPt: 16, minPt: 6, weight: 'bold', fill: ink, maxLines: 2 });
		expect(r.sizePt).toBeLessThan(16);
		expect(r.sizePt).toBeGreaterThanOrEqual(6);
		expect(r.lines.length).toBeLessThanOrEqual(2);
		expect(r.lines.join(' ')).toBe(name);
		expect(r.warning).toBeUndefined();
		expectInside(r.items, box);
		// The largest size that fits: one step up would not.
		const bigger = fitText(fonts, name, box, { maxPt: r.sizePt + 0.5, minPt: r.sizePt + 0.5, weight: 'bold', fill: ink, maxLines: 2 });
		expect(bigger.warning).toBeDefined();
	});

	it('shrinks a single line that may not wrap', () => {
		const r = fitText(fonts, 'Saffron and Bramble', box, { maxPt: 30, minPt: 6, wrap: false, fill: ink });
		expect(r.lines).toHaveLength(1);
		expect(fontkitWidthMm('regular', r.lines[0], r.sizePt)).toBeLessThanOrEqual(box.wMm);
		expect(fontkitWidthMm('regular', r.lines[0], r.sizePt + 0.5)).toBeGreaterThan(box.wMm);
	});

	it('warns when even the smallest size does not fit, and says so', () => {
		const long = 'A runner that lands here slides one space back, carrying its stack. '.repeat(6);
		const r = fitText(fonts, long, { ...box, hMm: 8 }, { maxPt: 10, minPt: 8, fill: ink, label: 'effect' });
		expect(r.sizePt).toBe(8);
		expect(r.warning).toMatch(/effect: ".*" does not fit .* at 8 pt; it overflows/);
	});

	it('cuts with an ellipsis only when allowed, still warning, and stays inside', () => {
		const long = 'A runner that lands here slides one space back, carrying its stack. '.repeat(6);
		const small = { ...box, hMm: 8 };
		const r = fitText(fonts, long, small, { maxPt: 10, minPt: 8, fill: ink, ellipsis: true });
		expect(r.warning).toMatch(/ellipsis/);
		expect(r.lines.at(-1)!.endsWith('\u2026')).toBe(true);
		expectInside(r.items, small);
	});

	it('warns when it must break a word to fit', () => {
		const r = fitText(fonts, 'Slimetrailmeisterschaft', { xMm: 0, yMm: 0, wMm: 12, hMm: 30 }, { maxPt: 12, minPt: 8, fill: ink });
		expect(r.warning).toMatch(/breaking a word/);
	});

	it('aligns lines left, centre and right, and places baselines from the font’s ascent', () => {
		const f = fonts.regular.metrics;
		const opts = { maxPt: 10, minPt: 10, fill: ink };
		const left = fitText(fonts, 'Dew', box, { ...opts, align: 'left' }).items[0];
		const centre = fitText(fonts, 'Dew', box, { ...opts, align: 'center' }).items[0];
		const right = fitText(fonts, 'Dew', box, { ...opts, align: 'right' }).items[0];
		const w = fontkitWidthMm('regular', 'Dew', 10);
		expect(left.xMm).toBeCloseTo(box.xMm, 9);
		expect(centre.xMm).toBeCloseTo(box.xMm + (box.wMm - w) / 2, 9);
		expect(right.xMm).toBeCloseTo(box.xMm + box.wMm - w, 9);
		expect(left.yMm).toBeCloseTo(box.yMm + (f.ascent / f.unitsPerEm) * 10 * (25.4 / 72), 9);
		const bottom = fitText(fonts, 'Dew', box, { ...opts, valign: 'bottom' }).items[0];
		expect(bottom.yMm).toBeCloseTo(box.yMm + box.hMm + (f.descent / f.unitsPerEm) * 10 * (25.4 / 72), 9);
	});

	it('textLine anchors a fixed-size label', () => {
		const t = textLine(fonts, 'coins', { xMm: 50, baselineMm: 10, align: 'right' }, 8, 'bold', ink);
		expect(t.xMm + t.widthMm).toBeCloseTo(50, 9);
		expect(t.widthMm).toBeCloseTo(fontkitWidthMm('bold', 'coins', 8), 9);
	});
});

describe('fitTitle', () => {
	const box: TextBox = { xMm: 0, yMm: 0, wMm: 40, hMm: 30 };
	const opts = { maxPt: 20, minPt: 8, weight: 'bold' as const, fill: ink, maxLines: 3 };

	it('keeps a short name on one line while it stays large', () => {
		const r = fitTitle(fonts, 'Dewdrop Derby', box, opts);
		expect(r.lines).toEqual(['Dewdrop Derby']);
		expect(r.sizePt).toBeGreaterThanOrEqual(14);
		expectInside(r.items, box);
	});

	it('takes more lines for a long name rather than shrinking it to nothing', () => {
		const r = fitTitle(fonts, 'The Long-Awaited Midsummer Dewdrop Derby', box, opts);
		expect(r.lines.length).toBeGreaterThan(1);
		expect(r.warning).toBeUndefined();
		expectInside(r.items, box);
	});
});


describe('widths of lines of words', () => {
	it('a line of ASCII words measures exactly as fontkit shapes the whole line (every line wrapping tries, demo texts)', () => {
		// Wrapping measures each candidate line; words are measured once and summed (see wordUnits).
		const texts = new Set<string>();
		const collect = (v: unknown): void => {
			if (typeof v === 'string') texts.add(v);
			else if (Array.isArray(v)) v.forEach(collect);
			else if (v && typeof v === 'object') Object.values(v).forEach(collect);
		};
		collect(demoGame());
		let lines = 0;
		for (const weight of ['regular', 'bold'] as const)
			for (const text of texts) {
				const words = text.split(/\s+/).filter(Boolean);
				for (let n = 2; n <= words.length; n++) {
					const line = words.slice(0, n).join(' ');
					expect(measureTextMm(fonts[weight].metrics, line, 10), line).toBe(fontkitWidthMm(weight, line, 10));
					lines++;
				}
			}
		expect(lines).toBeGreaterThan(500);
	});
});
