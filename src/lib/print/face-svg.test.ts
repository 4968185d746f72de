import { beforeAll, describe, expect, it } from 'vitest';
import { loadFonts, type FontSet } from './fonts';
import { linkedFaceSvg } from './face-svg';
import { measuringFonts, type MeasuringFonts } from './typeface';
import { testGame } from './layout/test-game';

// The browser measures with fontkit reading the woff2 files directly; the server with the
// TrueType that wawoff2 (the reference WOFF2 decoder, compiled to wasm) unpacks from them.
let server: FontSet;
let browser: MeasuringFonts;
beforeAll(async () => {
	server = await loadFonts();
	browser = measuringFonts({ regular: server.regular.woff2, bold: server.bold.woff2 });
});

describe('a face drawn from the woff2 files directly', () => {
	it('has the metrics of the decompressed TrueType (hhea ascent/descent, cap height, units per em)', () => {
		for (const w of ['regular', 'bold'] as const) {
			const a = browser[w].metrics;
			const b = server[w].metrics;
			expect([a.unitsPerEm, a.ascent, a.descent, a.capHeight]).toEqual([b.unitsPerEm, b.ascent, b.descent, b.capHeight]);
			const line = 'Quick brown fox, “AVATAR” Tw Ta — 1st ×2 €5 …';
			expect(a.layout(line).advanceWidth).toBe(b.layout(line).advanceWidth);
		}
	});

	it('is the very SVG the server draws, for every card of the test game, front and back', () => {
		const game = testGame();
		const artUrl = (sha: string) => `/art/${sha}`;
		for (const card of game.cards) {
			const kind = game.kinds.find((k) => k.id === card.kindId)!;
			for (const side of ['front', 'back'] as const) {
				const a = linkedFaceSvg({ game, kind, card, side, guides: true, fonts: browser, artUrl });
				const b = linkedFaceSvg({ game, kind, card, side, guides: true, fonts: server, artUrl });
				expect(a.svg, `${card.name} ${side}`).toBe(b.svg);
				expect(a.layout.warnings).toEqual(b.layout.warnings);
			}
		}
	});
});
