/**
 * The card editors' live preview is laid out and drawn in the browser. Two checks against things
 * outside that code path:
 * - Same pixels: each face the browser draws, rasterised by chromium onto a canvas, against the
 *   server's authoritative render of the same saved face (…/face.svg, laid out in Node) rasterised
 *   by resvg, an SVG renderer independent of the browser; compared with pixelmatch.
 * - A keystroke redraws the face without a single request to the server.
 */
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { expect, test, type Page } from '@playwright/test';
import { initWasm, Resvg } from '@resvg/resvg-wasm';
import pixelmatch from 'pixelmatch';
import { PNG } from 'pngjs';
import { demoGameId, hydrated, signIn, signInNewBrowser } from './helpers';

const require = createRequire(import.meta.url);
const fontFile = (weight: number) => readFileSync(require.resolve(`@fontsource/roboto-slab/files/roboto-slab-latin-${weight}-normal.woff2`));
const FONTS = { regular: fontFile(400), bold: fontFile(700) };

/** Both rasters are this many pixels wide (about 230 dpi across a 69 mm face with its bleed). */
const WIDTH_PX = 620;

/**
 * Two bounds on the pixels pixelmatch counts as different (threshold 0.1, its default; pixels it
 * takes for anti-aliasing are not counted). Chromium (Skia) and resvg hint and anti-alias glyph
 * edges differently, and chromium rounds glyph advances to whole pixels, so long lines of small
 * text drift by a pixel here and there: measured on the demo faces, 0.005–0.2 % of a face and at
 * most 52 pixels in any 24 × 24 window, spread thinly along edges. A layout difference moves
 * whole glyphs together: text moved by 0.3 mm (under 3 pixels) puts 84–184 differing pixels in
 * one window even on the sparsest face, and 0.3–1.9 % over a face with more words (checked below
 * on every face, so the bounds are shown to catch it).
 */
const MAX_DIFF_SHARE = 0.004;
const WINDOW_PX = 24;
const MAX_DIFF_IN_WINDOW = 64;

let resvgReady: Promise<void> | undefined;

/** The server's standalone face (art and fonts inside it) as resvg draws it, on white. */
async function serverRaster(svg: string) {
	resvgReady ??= initWasm(readFileSync(require.resolve('@resvg/resvg-wasm/index_bg.wasm')));
	await resvgReady;
	const resvg = new Resvg(svg, {
		fitTo: { mode: 'width', value: WIDTH_PX },
		background: '#ffffff',
		font: { fontBuffers: [FONTS.regular, FONTS.bold], loadSystemFonts: false, defaultFontFamily: 'Roboto Slab', serifFamily: 'Roboto Slab' }
	});
	const image = resvg.render();
	const out = { width: image.width, height: image.height, rgba: new Uint8Array(image.pixels) };
	image.free();
	resvg.free();
	return out;
}

/**
 * A face SVG as chromium draws it onto a canvas of the given size, on white. An SVG drawn as an
 * image reaches nothing outside itself, so its linked art and the fonts go inside it first.
 */
async function browserRaster(page: Page, svg: string, width: number, height: number) {
	const b64 = await page.evaluate(
		async ({ svg, fonts, width, height }) => {
			const dataUrl = (blob: Blob) =>
				new Promise<string>((resolve) => {
					const reader = new FileReader();
					reader.onload = () => resolve(reader.result as string);
					reader.readAsDataURL(blob);
				});
			let doc = svg;
			for (const url of new Set([...svg.matchAll(/href="(\/[^"]+)"/g)].map((m) => m[1]))) {
				doc = doc.split(`"${url}"`).join(`"${await dataUrl(await (await fetch(url)).blob())}"`);
			}
			const face = (weight: number, b: string) =>
				`@font-face{font-family:'Roboto Slab';font-weight:${weight};src:url(data:font/woff2;base64,${b}) format('woff2')}`;
			doc = doc.replace(/(<svg\b[^>]*>)/, `$1<style>${face(400, fonts.regular)}${face(700, fonts.bold)}</style>`);
			const img = new Image();
			img.src = URL.createObjectURL(new Blob([doc], { type: 'image/svg+xml' }));
			await img.decode();
			const canvas = document.createElement('canvas');
			canvas.width = width;
			canvas.height = height;
			const ctx = canvas.getContext('2d')!;
			ctx.fillStyle = '#ffffff';
			ctx.fillRect(0, 0, width, height);
			ctx.drawImage(img, 0, 0, width, height);
			const bytes = new Uint8Array(ctx.getImageData(0, 0, width, height).data.buffer);
			let bin = '';
			for (let i = 0; i < bytes.length; i += 0x8000) bin += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
			return btoa(bin);
		},
		{ svg, fonts: { regular: FONTS.regular.toString('base64'), bold: FONTS.bold.toString('base64') }, width, height }
	);
	return new Uint8Array(Buffer.from(b64, 'base64'));
}

interface Difference {
	/** Share of the face's pixels that differ. */
	share: number;
	/** Most differing pixels in any WINDOW_PX square (windows overlap by half). */
	densest: number;
}

/** How two RGBA rasters of one size differ; the difference image is kept to look at. */
function compare(a: Uint8Array, b: Uint8Array, width: number, height: number, keepAs?: string): Difference {
	const mask = new PNG({ width, height });
	const count = pixelmatch(a, b, mask.data, width, height, { threshold: 0.1, diffMask: true, diffColor: [255, 0, 0] });
	if (keepAs) {
		mkdirSync('test-results', { recursive: true });
		writeFileSync(`test-results/live-preview-diff-${keepAs}.png`, PNG.sync.write(mask));
	}
	const differs = (x: number, y: number) => {
		const i = (y * width + x) * 4;
		return mask.data[i + 3] > 0 && mask.data[i] === 255 && mask.data[i + 1] === 0;
	};
	let densest = 0;
	const step = WINDOW_PX / 2;
	for (let wy = 0; wy < height; wy += step)
		for (let wx = 0; wx < width; wx += step) {
			let n = 0;
			for (let y = wy; y < Math.min(height, wy + WINDOW_PX); y++) for (let x = wx; x < Math.min(width, wx + WINDOW_PX); x++) if (differs(x, y)) n++;
			densest = Math.max(densest, n);
		}
	return { share: count / (width * height), densest };
}

const withinBounds = (d: Difference) => d.share <= MAX_DIFF_SHARE && d.densest <= MAX_DIFF_IN_WINDOW;

/** The same face with every text run moved 0.3 mm right: what a layout difference looks like. */
const shiftText = (svg: string) => svg.replace(/<text\b/g, '<text transform="translate(0.3 0)"');

/** The preview's two faces, as the browser drew them with the guides off. */
async function previewSvgs(page: Page) {
	const preview = page.getByTestId('card-preview');
	for (const label of ['Trim', 'Bleed', 'Safe area']) await page.getByLabel(label, { exact: true }).uncheck();
	await expect(preview.locator('svg')).toHaveCount(2);
	await expect(preview.locator('svg [stroke="#e8175d"]')).toHaveCount(0);
	return preview.locator('svg').evaluateAll((els) => els.map((el) => new XMLSerializer().serializeToString(el)));
}

test('faces drawn in the browser match the server’s render of the same faces', async ({ page }) => {
	test.setTimeout(240_000);
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	const { cards } = (await (await page.request.get(`/api/v1/games/${gameId}/cards`)).json()) as {
		cards: { id: string; kindId: string; kind: string; name: string }[];
	};
	// One card of each of several types (portrait and landscape, shared and per-card backs).
	const picked = ['movement', 'wager', 'rogue', 'setup', 'tile']
		.map((type) => cards.find((c) => c.kind === type))
		.filter((c) => c !== undefined);
	expect(picked.length).toBeGreaterThanOrEqual(4);

	const measured: { face: string; same: Difference; shifted: Difference }[] = [];
	const show = (d: Difference) => `${(d.share * 100).toFixed(3)} %, densest window ${d.densest} px`;
	for (const card of picked) {
		await page.goto(`/games/${gameId}/kinds/${card.kindId}?card=${card.id}`);
		await hydrated(page);
		const [front, back] = await previewSvgs(page);
		for (const [side, browserSvg] of [['front', front], ['back', back]] as const) {
			const res = await page.request.get(`/api/v1/games/${gameId}/cards/${card.id}/${side === 'front' ? 'face' : 'back'}.svg?guides=none`);
			expect(res.status()).toBe(200);
			const server = await serverRaster(await res.text());
			const browser = await browserRaster(page, browserSvg, server.width, server.height);
			const same = compare(browser, server.rgba, server.width, server.height, `${card.kind}-${side}`);
			const shifted = compare(await browserRaster(page, shiftText(browserSvg), server.width, server.height), server.rgba, server.width, server.height);
			measured.push({ face: `${card.kind} “${card.name}” ${side}`, same, shifted });
		}
	}
	console.log(`Differing pixels, browser vs server:\n${measured.map((m) => `  ${m.face}: ${show(m.same)} (text moved 0.3 mm: ${show(m.shifted)})`).join('\n')}`);
	for (const m of measured) {
		expect(m.same.share, m.face).toBeLessThanOrEqual(MAX_DIFF_SHARE);
		expect(m.same.densest, m.face).toBeLessThanOrEqual(MAX_DIFF_IN_WINDOW);
		// The bounds must catch a real layout difference on this very face.
		expect(withinBounds(m.shifted), `${m.face}, text moved`).toBe(false);
	}
});

/** Opens a saved card of the given type in its kind's editor, the preview drawn. */
async function openCard(page: Page, gameId: string, type: string) {
	const { cards } = (await (await page.request.get(`/api/v1/games/${gameId}/cards`)).json()) as {
		cards: { id: string; kindId: string; kind: string }[];
	};
	const card = cards.find((c) => c.kind === type)!;
	await page.goto(`/games/${gameId}/kinds/${card.kindId}?card=${card.id}`);
	await hydrated(page);
	const preview = page.getByTestId('card-preview');
	await expect(preview.locator('svg')).toHaveCount(2);
	// The page's own loads (its fonts, the art) are over before anyone types.
	await page.waitForLoadState('networkidle');
	await page.evaluate(() => document.fonts.ready.then(() => undefined));
	return preview;
}

test('a keystroke redraws the card’s face in the page, without a request', async ({ page }) => {
	test.setTimeout(120_000);
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	const requests: string[] = [];
	const listen = () => page.on('request', (r) => requests.push(`${r.method()} ${r.url()}`));

	// A movement card prints its name: each letter typed reaches the face.
	let preview = await openCard(page, gameId, 'movement');
	listen();
	const name = page.getByRole('textbox', { name: /^Card name/ });
	await name.fill('');
	await name.pressSequentially('Quillon', { delay: 20 });
	await expect(preview.locator('svg').first()).toContainText('Quillon');
	await expect(page.getByRole('heading', { name: 'Preview of “Quillon”' })).toBeVisible();
	await page.screenshot({ path: 'test-results/live-preview-name.png', fullPage: true });
	expect(requests).toEqual([]);

	// A wager's tier sets what it pays: the payout rows on the face change with it.
	page.removeAllListeners('request');
	page.on('dialog', (d) => void d.accept());
	preview = await openCard(page, gameId, 'wager');
	listen();
	const before = await preview.locator('svg').first().textContent();
	const tier = page.getByRole('spinbutton', { name: /^Tier/ });
	const now = Number(await tier.inputValue());
	await tier.fill(String(now === 1 ? 2 : 1));
	await expect.poll(() => preview.locator('svg').first().textContent()).not.toBe(before);
	await page.screenshot({ path: 'test-results/live-preview-tier.png', fullPage: true });
	expect(requests).toEqual([]);
});

test('an artist and a reviewer see the preview drawn as well', async ({ browser }) => {
	test.setTimeout(120_000);
	for (const who of ['artist@paddock.test', 'reviewer@paddock.test']) {
		const page = await signInNewBrowser(browser, who);
		const gameId = await demoGameId(page);
		const preview = await openCard(page, gameId, 'movement');
		await expect(page.getByRole('alert')).toHaveCount(0);
		// The art the faces link to is readable in this role (the demo's movement kind has art on both faces).
		const art = await preview.locator('svg image').evaluateAll((els) => els.map((el) => el.getAttribute('href') ?? el.getAttribute('xlink:href')));
		expect(art.length).toBeGreaterThan(0);
		for (const href of new Set(art)) expect((await page.request.get(href!)).status(), href!).toBe(200);
		await page.waitForLoadState('networkidle');
		await page.screenshot({ path: `test-results/live-preview-${who.split('@')[0]}.png`, fullPage: true });
		await page.context().close();
	}
});
