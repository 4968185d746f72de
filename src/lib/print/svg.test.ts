import { describe, expect, it } from 'vitest';
import type { FaceLayout, ImageAsset } from './display-list';
import { base64, escapeXml, renderSvg } from './svg';

/** Poker trim 2.5 × 3.5 in = 63.5 × 88.9 mm (common practice; 1 in = 25.4 mm exactly). */
const POKER = { trimWidthMm: 63.5, trimHeightMm: 88.9 };
/** US bleed and safe area: 1/8 in = 3.175 mm per side (common practice). */
const EIGHTH_INCH_MM = 25.4 / 8;

const face = (items: FaceLayout['items'] = []): FaceLayout => ({
	...POKER,
	bleedMm: EIGHTH_INCH_MM,
	safeMm: EIGHTH_INCH_MM,
	cornerRadiusMm: 3.175,
	items,
	warnings: []
});

describe('renderSvg', () => {
	it('sizes the document in mm: a poker card with 1/8 in bleed is 69.85 × 95.25 mm', () => {
		const svg = renderSvg(face(), new Map());
		// 63.5 + 2 × 3.175 = 69.85; 88.9 + 2 × 3.175 = 95.25.
		expect(svg).toMatch(/^<svg [^>]*width="69.85mm"/);
		expect(svg).toMatch(/^<svg [^>]*height="95.25mm"/);
		expect(svg).toMatch(/^<svg [^>]*viewBox="0 0 69.85 95.25"/);
	});

	it('escapes text for XML (XML 1.0 §2.4) and drops characters XML cannot hold', () => {
		const text = `Rock & <Roll> "quoted" 'single'\u0007`;
		const svg = renderSvg(
			face([{ type: 'text', xMm: 5, yMm: 10, text, sizePt: 10, weight: 'bold', fill: { hex: '#000000' }, widthMm: 30 }]),
			new Map()
		);
		expect(svg).toContain('Rock &amp; &lt;Roll&gt; &quot;quoted&quot; &apos;single&apos;</text>');
		expect(svg).not.toContain('\u0007');
		expect(escapeXml('a<b')).toBe('a&lt;b');
	});

	it('draws text at the measured baseline with the size in mm (pt × 25.4/72)', () => {
		const svg = renderSvg(
			face([{ type: 'text', xMm: 5.5, yMm: 12.25, text: 'Dew', sizePt: 72, weight: 'regular', fill: { hex: '#112233' }, widthMm: 20 }]),
			new Map()
		);
		expect(svg).toContain('<text x="5.5" y="12.25" font-family="Roboto Slab" font-size="25.4" font-weight="400" fill="#112233">Dew</text>');
	});

	it('leaves guides off by default, and draws trim solid, bleed edge and safe area dashed on request', () => {
		expect(renderSvg(face(), new Map())).not.toContain('id="guides"');
		const svg = renderSvg(face(), new Map(), { guides: true });
		const guides = svg.slice(svg.indexOf('<g id="guides">'));
		const trim = guides.match(/<rect x="3.175" y="3.175" width="63.5" height="88.9"[^>]*>/)?.[0];
		expect(trim).toBeDefined();
		expect(trim).toContain('rx="3.175"');
		expect(trim).not.toContain('dasharray');
		// Safe area: 1/8 in inside the trim.
		const safe = guides.match(/<rect x="6.35" y="6.35" width="57.15" height="82.55"[^>]*>/)?.[0];
		expect(safe).toContain('stroke-dasharray');
		const onlySafe = renderSvg(face(), new Map(), { guides: { safe: true } });
		expect(onlySafe).toContain('stroke-dasharray');
		expect(onlySafe).not.toContain('width="63.5"');
	});

	it('inlines images as data: URIs, or asks a resolver for a URL, clipped to their slot', () => {
		const bytes = new Uint8Array([137, 80, 78, 71, 1, 2, 3]);
		const asset: ImageAsset = { id: 'abc', mime: 'image/png', bytes, widthPx: 2, heightPx: 1 };
		const item = {
			type: 'image' as const,
			xMm: 0,
			yMm: 10,
			wMm: 40,
			hMm: 20,
			imageId: 'abc',
			radiusMm: 2,
			clip: { xMm: 5, yMm: 10, wMm: 30, hMm: 20 }
		};
		const inline = renderSvg(face([item]), new Map([['abc', asset]]));
		expect(inline).toContain(`href="data:image/png;base64,${Buffer.from(bytes).toString('base64')}"`);
		expect(inline).toMatch(/<clipPath id="clip0"><rect x="5" y="10" width="30" height="20" rx="2"\/><\/clipPath>/);
		expect(inline).toContain('clip-path="url(#clip0)"');
		const linked = renderSvg(face([item]), (id) => `/api/art/${id}?a=1&b=2`);
		expect(linked).toContain('href="/api/art/abc?a=1&amp;b=2"');
	});

	it('base64 matches Node’s encoder (RFC 4648) for every padding case', () => {
		for (const n of [0, 1, 2, 3, 4, 5, 31, 256]) {
			const bytes = Uint8Array.from({ length: n }, (_, i) => (i * 37 + 11) & 255);
			expect(base64(bytes)).toBe(Buffer.from(bytes).toString('base64'));
		}
	});
});
