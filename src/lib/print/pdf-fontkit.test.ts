import fontkit from '@pdf-lib/fontkit';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadFonts, type FontSet } from './fonts';
import { sharedFontkit } from './pdf-fontkit';

let fonts: FontSet;
beforeAll(async () => {
	fonts = await loadFonts();
});

describe('sharedFontkit', () => {
	it('parses a typeface file once and shapes each string once', () => {
		const a = sharedFontkit.create(new Uint8Array(fonts.bold.ttf));
		const b = sharedFontkit.create(new Uint8Array(fonts.bold.ttf));
		expect(a.layout('Rosehip')).toBe(b.layout('Rosehip'));
		// Shaping is fontkit's own: the same glyphs and advances as a font used directly.
		const direct = fontkit.create(Buffer.from(fonts.bold.ttf)).layout('Stage, first pick');
		const shared = a.layout('Stage, first pick');
		expect(shared.glyphs.map((g) => g.id)).toEqual(direct.glyphs.map((g) => g.id));
		expect(shared.advanceWidth).toBe(direct.advanceWidth);
	});

	it('lists the ligatures shaping produced with the characters they stand for (for /W and ToUnicode)', () => {
		const font = sharedFontkit.create(new Uint8Array(fonts.regular.ttf));
		const fi = font.layout('first').glyphs[0];
		// The fi ligature is one glyph for two characters, reached by GSUB, not by the cmap.
		expect(fi.codePoints).toEqual([0x66, 0x69]);
		const listed = font.characterSet.map((cp) => font.glyphForCodePoint(cp));
		expect(listed.some((g) => g.id === fi.id && g.codePoints.join() === '102,105')).toBe(true);
	});

	it('a document lists only the ligatures its own texts produced (the same texts give the same font dictionary)', () => {
		const before = sharedFontkit.create(new Uint8Array(fonts.regular.ttf));
		before.layout('first');
		const fresh = sharedFontkit.create(new Uint8Array(fonts.regular.ttf));
		const beyondCmap = (f: typeof fresh) => f.characterSet.filter((cp) => cp > 0x10ffff).length;
		expect(beyondCmap(fresh)).toBe(0);
		fresh.layout('first');
		expect(beyondCmap(fresh)).toBe(1);
	});

	it('the shipped font shapes nothing across a space, so a label is as wide as its words and spaces', () => {
		// Every pair of printable ASCII characters around a space (sheets.ts measures labels by words).
		for (const weight of ['regular', 'bold'] as const) {
			const font = fontkit.create(Buffer.from(fonts[weight].ttf));
			const w = (s: string) => font.layout(s).advanceWidth;
			const space = w(' ');
			let differing = 0;
			for (let a = 33; a < 127; a++)
				for (let b = 33; b < 127; b++) {
					const [x, y] = [String.fromCharCode(a), String.fromCharCode(b)];
					if (Math.abs(w(`${x} ${y}`) - (w(x) + space + w(y))) > 1e-6) differing++;
				}
			expect(differing, weight).toBe(0);
		}
	});
});
