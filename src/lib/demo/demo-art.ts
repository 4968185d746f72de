/**
 * The demo game's illustrations: our own simple drawings as SVG (snails in each runner's colour
 * with its symbol on the shell, a ground beetle, hazard icons, leaf / coin / pebble / dew backs,
 * soil for the track tiles), rendered to PNG with resvg.
 *
 * No text is drawn, so no font is needed. Render sizes aim at ≥ 300 dpi in each slot, except two
 * pieces left deliberately coarse (Pebble's portrait, the hazard back) so the art warning shows.
 */
import { Resvg } from '@resvg/resvg-wasm';
import { faceWithBleedMm, pxForPrint, type SlotMm } from '../game/art-check';
import { sha256Hex } from '../game/bundle';
import { DEMO_KINDS, DEMO_ROGUE, DEMO_RUNNERS, demoGame } from './demo';
import type { ArtAsset, ArtAssignment, ArtStatus, CardKind, Game, RunnerSymbol } from '../game/model';
import { symbolPath } from '../print/symbols';
import { resvgReady } from '../print/png';

/* ------------------------------------------------------------- helpers */

/** Deterministic pseudo-random numbers (mulberry32), so the art is the same on every run. */
function random(seed: number) {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

const f = (v: number) => (Math.round(v * 100) / 100).toString();

function shade(hex: string, factor: number): string {
	const c = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));
	const mixed = c.map((v) => Math.round(factor < 1 ? v * factor : v + (255 - v) * (factor - 1)));
	return '#' + mixed.map((v) => Math.max(0, Math.min(255, v)).toString(16).padStart(2, '0')).join('');
}

/** A shell spiral (Archimedean) around (cx, cy), from radius r0 out to r1. */
function spiral(cx: number, cy: number, r0: number, r1: number, turns: number, start = 0): string {
	const steps = Math.round(turns * 48);
	const pts: string[] = [];
	for (let i = 0; i <= steps; i++) {
		const t = i / steps;
		const a = start + t * turns * 2 * Math.PI;
		const r = r0 + (r1 - r0) * t;
		pts.push(`${i === 0 ? 'M' : 'L'}${f(cx + r * Math.cos(a))} ${f(cy + r * Math.sin(a))}`);
	}
	return pts.join('');
}

const svg = (w: number, h: number, body: string) =>
	`<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${f(w)} ${f(h)}" width="${f(w)}" height="${f(h)}">${body}</svg>`;

/* ---------------------------------------------------------- illustrations */

/** A garden snail with a shell in `colourHex`, the runner's symbol on a badge in its middle. */
export function snailSvg(colourHex: string, symbol: RunnerSymbol): string {
	const dark = shade(colourHex, 0.55);
	return svg(
		100,
		100,
		`<rect width="100" height="100" fill="#eef2e2"/>` +
			`<ellipse cx="50" cy="88" rx="48" ry="9" fill="#cfdcb4"/>` +
			`<path d="M80 47 L75 29" stroke="#8c7448" stroke-width="2.2" stroke-linecap="round"/>` +
			`<path d="M85 47 L89 30" stroke="#8c7448" stroke-width="2.2" stroke-linecap="round"/>` +
			`<circle cx="75" cy="28" r="2.8" fill="#3a2f22"/><circle cx="89" cy="29" r="2.8" fill="#3a2f22"/>` +
			`<path d="M6 85 C6 77 14 75 22 75 L62 75 C70 75 74 71 76 63 L79 48 C80 43 87 42 89 46 C91 51 89 57 88 63 L86 76 C85 83 79 87 71 87 L12 87 C8 87 6 87 6 85 Z" fill="#dcc9a0" stroke="#8c7448" stroke-width="1.2"/>` +
			`<circle cx="44" cy="52" r="26" fill="${colourHex}" stroke="${dark}" stroke-width="1.6"/>` +
			`<path d="${spiral(44, 52, 10, 24, 2.2, Math.PI / 2)}" fill="none" stroke="${dark}" stroke-width="1.8" stroke-linecap="round"/>` +
			`<path d="M25 42 C27 34 33 29 40 27.5" fill="none" stroke="#ffffff" stroke-opacity="0.45" stroke-width="3" stroke-linecap="round"/>` +
			`<circle cx="44" cy="52" r="9.5" fill="#fffaf0" stroke="${dark}" stroke-width="1.2"/>` +
			`<path d="${symbolPath(symbol, 44, 52, 11)}" fill="${dark}"/>`
	);
}

/** The rogue: a ground beetle seen from above, an arrow behind it pointing the wrong way. */
export function beetleSvg(colourHex: string, symbol: RunnerSymbol): string {
	const legs = [-1, 1]
		.flatMap((side) =>
			[40, 52, 64].map((x, i) => {
				const y0 = 52 + side * 12;
				const knee = `${f(x + (i - 1) * 4)} ${f(52 + side * 22)}`;
				const foot = `${f(x + (i - 1) * 9)} ${f(52 + side * 30)}`;
				return `<path d="M${x} ${y0} L${knee} L${foot}" fill="none" stroke="${colourHex}" stroke-width="2" stroke-linecap="round" stroke-linejoin="round"/>`;
			})
		)
		.join('');
	return svg(
		100,
		100,
		`<rect width="100" height="100" fill="#efe7da"/>` +
			`<path d="M6 50 L26 32 L26 43 L70 43 L70 57 L26 57 L26 68 Z" fill="#dccbb0"/>` +
			legs +
			`<path d="M84 48 C90 40 92 34 96 30 M84 56 C90 64 92 70 96 74" fill="none" stroke="${colourHex}" stroke-width="1.6" stroke-linecap="round"/>` +
			`<ellipse cx="46" cy="52" rx="24" ry="16" fill="${colourHex}"/>` +
			`<ellipse cx="72" cy="52" rx="7" ry="11" fill="${shade(colourHex, 1.12)}"/>` +
			`<circle cx="82" cy="52" r="6" fill="${colourHex}"/>` +
			`<path d="M24 52 L68 52" stroke="#6d655c" stroke-width="1"/>` +
			`<path d="M30 44 C38 40 50 39 60 42" fill="none" stroke="#ffffff" stroke-opacity="0.3" stroke-width="2.2" stroke-linecap="round"/>` +
			`<circle cx="46" cy="52" r="7" fill="#f5efe4"/>` +
			`<path d="${symbolPath(symbol, 46, 52, 8)}" fill="${colourHex}"/>`
	);
}

/** A cream disc with a shell spiral: the emblem in the middle of every back. */
function emblem(cx: number, cy: number, r: number, ink: string) {
	return (
		`<circle cx="${f(cx)}" cy="${f(cy)}" r="${f(r)}" fill="#f1ead2" stroke="#c9b98a" stroke-width="${f(r * 0.05)}"/>` +
		`<path d="${spiral(cx, cy, r * 0.12, r * 0.78, 2.6, Math.PI / 2)}" fill="none" stroke="${ink}" stroke-width="${f(r * 0.09)}" stroke-linecap="round"/>`
	);
}

/** Card back with leaves, drawn in mm at the face size including bleed. */
export function leafBackSvg(widthMm: number, heightMm: number): string {
	const leaf = 'M0 -5 C3.2 -3 3.2 3 0 5 C-3.2 3 -3.2 -3 0 -5 Z';
	let body = `<rect width="${f(widthMm)}" height="${f(heightMm)}" fill="#2f5d34"/>`;
	const step = 11;
	for (let row = -1; row * step < heightMm + step; row++)
		for (let col = -1; col * step < widthMm + step; col++) {
			const x = col * step + (row % 2 ? step / 2 : 0);
			const y = row * step;
			const angle = (row + col) % 2 ? 35 : -35;
			body +=
				`<g transform="translate(${f(x)} ${f(y)}) rotate(${angle})">` +
				`<path d="${leaf}" fill="#3f7a45"/><path d="M0 -4.2 L0 4.2" stroke="#2f5d34" stroke-width="0.35"/></g>`;
		}
	body += emblem(widthMm / 2, heightMm / 2, Math.min(widthMm, heightMm) * 0.22, '#2f5d34');
	return svg(widthMm, heightMm, body);
}

/** Wager back: coins on a berry-red ground. */
export function coinBackSvg(widthMm: number, heightMm: number): string {
	let body = `<rect width="${f(widthMm)}" height="${f(heightMm)}" fill="#6b2d3a"/>`;
	const step = 12;
	for (let row = -1; row * step < heightMm + step; row++)
		for (let col = -1; col * step < widthMm + step; col++) {
			const x = col * step + (row % 2 ? step / 2 : 0);
			const y = row * step;
			body +=
				`<circle cx="${f(x)}" cy="${f(y)}" r="3.8" fill="#d9a441" stroke="#a87622" stroke-width="0.4"/>` +
				`<circle cx="${f(x)}" cy="${f(y)}" r="2.5" fill="none" stroke="#a87622" stroke-width="0.3"/>`;
		}
	body += emblem(widthMm / 2, heightMm / 2, Math.min(widthMm, heightMm) * 0.22, '#6b2d3a');
	return svg(widthMm, heightMm, body);
}

/** Setup and player-aid back: river pebbles. */
export function pebbleBackSvg(widthMm: number, heightMm: number, seed = 7): string {
	const rnd = random(seed);
	const greys = ['#7b8590', '#8f98a2', '#69737e', '#a3abb3'];
	let body = `<rect width="${f(widthMm)}" height="${f(heightMm)}" fill="#56606b"/>`;
	const count = Math.round((widthMm * heightMm) / 40);
	for (let i = 0; i < count; i++) {
		const x = rnd() * widthMm;
		const y = rnd() * heightMm;
		const rx = 1.5 + rnd() * 3;
		const ry = rx * (0.55 + rnd() * 0.35);
		body += `<ellipse cx="${f(x)}" cy="${f(y)}" rx="${f(rx)}" ry="${f(ry)}" transform="rotate(${Math.round(rnd() * 180)} ${f(x)} ${f(y)})" fill="${greys[i % greys.length]}"/>`;
	}
	body += emblem(widthMm / 2, heightMm / 2, Math.min(widthMm, heightMm) * 0.22, '#56606b');
	return svg(widthMm, heightMm, body);
}

/** Hazard back: dew drops on blue-green. */
export function dewBackSvg(widthMm: number, heightMm: number): string {
	const drop = 'M0 -3.2 C1.6 -1 2.2 0.4 2.2 1.2 C2.2 2.6 1.2 3.4 0 3.4 C-1.2 3.4 -2.2 2.6 -2.2 1.2 C-2.2 0.4 -1.6 -1 0 -3.2 Z';
	let body = `<rect width="${f(widthMm)}" height="${f(heightMm)}" fill="#2b6f75"/>`;
	const step = 9;
	for (let row = -1; row * step < heightMm + step; row++)
		for (let col = -1; col * step < widthMm + step; col++) {
			const x = col * step + (row % 2 ? step / 2 : 0);
			body += `<path transform="translate(${f(x)} ${f(row * step)})" d="${drop}" fill="#9fd6d3" fill-opacity="0.7"/>`;
		}
	body += emblem(widthMm / 2, heightMm / 2, Math.min(widthMm, heightMm) * 0.22, '#2b6f75');
	return svg(widthMm, heightMm, body);
}

/** Track tile ground: soil with grass along the long edges (spaces are drawn by the layout). */
export function soilSvg(widthMm: number, heightMm: number, seed = 11): string {
	const rnd = random(seed);
	let body = `<rect width="${f(widthMm)}" height="${f(heightMm)}" fill="#7a5a3a"/>`;
	for (let i = 0; i < Math.round(widthMm * heightMm * 0.08); i++)
		body += `<circle cx="${f(rnd() * widthMm)}" cy="${f(rnd() * heightMm)}" r="${f(0.2 + rnd() * 0.5)}" fill="${rnd() < 0.5 ? '#684b30' : '#8a6a48'}"/>`;
	for (const edge of [0, heightMm]) {
		const dir = edge === 0 ? 1 : -1;
		let d = '';
		for (let x = -2; x < widthMm + 4; x += 2.2 + rnd() * 1.2) {
			const tall = 3 + rnd() * 5;
			d += `M${f(x)} ${f(edge)} L${f(x + 1.1)} ${f(edge + dir * tall)} L${f(x + 2.2)} ${f(edge)} Z`;
		}
		body += `<rect x="0" y="${f(edge === 0 ? 0 : heightMm - 4)}" width="${f(widthMm)}" height="4" fill="#4f7f3a"/>`;
		body += `<path d="${d}" fill="#5f9444"/>`;
	}
	return svg(widthMm, heightMm, body);
}

/** Dew Trail: a shining slime trail with dew drops along it. */
export function dewTrailIconSvg(): string {
	const drop = (x: number, y: number, s: number) =>
		`<path transform="translate(${x} ${y}) scale(${s})" d="M0 -10 C5 -3 7 1 7 4 C7 8.5 4 11 0 11 C-4 11 -7 8.5 -7 4 C-7 1 -5 -3 0 -10 Z" fill="#5fa8d3"/>`;
	return svg(
		100,
		100,
		`<rect width="100" height="100" fill="#eef4ea"/>` +
			`<path d="M8 78 C28 70 30 46 50 46 C70 46 72 26 92 20" fill="none" stroke="#c9d9e3" stroke-width="12" stroke-linecap="round"/>` +
			`<path d="M8 78 C28 70 30 46 50 46 C70 46 72 26 92 20" fill="none" stroke="#ffffff" stroke-opacity="0.8" stroke-width="3" stroke-linecap="round"/>` +
			`<path d="M70 80 L86 80 L86 72 L96 84 L86 96 L86 88 L70 88 Z" fill="#3f7f5a"/>` +
			drop(30, 30, 1.3) +
			drop(60, 66, 1.1) +
			drop(80, 44, 0.9)
	);
}

/** Fallen Leaf: a broad leaf lying downhill, an arrow along its midrib. */
export function fallenLeafIconSvg(): string {
	return svg(
		100,
		100,
		`<rect width="100" height="100" fill="#f6f0e0"/>` +
			`<g transform="rotate(-28 50 50)">` +
			`<path d="M8 50 C26 22 70 20 92 50 C70 80 26 78 8 50 Z" fill="#d08a2e" stroke="#8f5a1c" stroke-width="2"/>` +
			`<path d="M10 50 L90 50" stroke="#8f5a1c" stroke-width="2.2"/>` +
			[30, 48, 66].map((x) => `<path d="M${x} 50 L${x + 12} 36 M${x} 50 L${x + 12} 64" stroke="#8f5a1c" stroke-width="1.4"/>`).join('') +
			`<path d="M78 50 L68 43 L68 57 Z" fill="#5a3510"/>` +
			`</g>`
	);
}

/** Thistle Patch: a spiky purple head on a prickly stem, small enough for a wide icon box. */
export function thistleIconSvg(): string {
	const spikes = Array.from({ length: 9 }, (_, i) => {
		const a = Math.PI * (1.1 + (0.8 * i) / 8);
		return `<path d="M50 34 L${f(50 + 26 * Math.cos(a))} ${f(34 + 26 * Math.sin(a))}" stroke="#8a3f8f" stroke-width="3" stroke-linecap="round"/>`;
	}).join('');
	return svg(
		100,
		100,
		`<rect width="100" height="100" fill="#f3eef4"/>` +
			`<g transform="translate(50 52) scale(0.52) translate(-50 -60)">` +
			`<path d="M50 50 L50 94" stroke="#4f7a3a" stroke-width="4"/>` +
			`<path d="M50 74 L30 62 L36 70 L22 70 L34 76 L26 84 L50 80 M50 66 L70 54 L64 62 L78 62 L66 68 L74 76 L50 72" fill="#5f8f46" stroke="#4f7a3a" stroke-width="1.5" stroke-linejoin="round"/>` +
			spikes +
			`<ellipse cx="50" cy="50" rx="13" ry="11" fill="#6f9a52" stroke="#4f7a3a" stroke-width="1.5"/>` +
			`<path d="M40 46 L46 54 M46 44 L52 54 M52 44 L58 54 M58 46 L60 52" stroke="#4f7a3a" stroke-width="1.2"/>` +
			`</g>`
	);
}

/** Boot Print: a deep tread mark pressed into the soil, lying along the track. */
export function bootPrintIconSvg(): string {
	const treads = [24, 32, 40, 48, 56].map((y) => `<rect x="36" y="${y}" width="28" height="4" rx="2" fill="#4a3826"/>`).join('');
	return svg(
		100,
		100,
		`<rect width="100" height="100" fill="#efe6d6"/>` +
			`<g transform="translate(50 50) rotate(90) scale(0.62) translate(-50 -50)">` +
			`<path d="M50 12 C66 12 70 26 68 42 C66 56 64 62 62 66 L38 66 C36 62 34 56 32 42 C30 26 34 12 50 12 Z" fill="#7a5f44"/>` +
			`<ellipse cx="50" cy="82" rx="13" ry="10" fill="#7a5f44"/>` +
			treads +
			[76, 84].map((y) => `<rect x="40" y="${y}" width="20" height="3.4" rx="1.7" fill="#4a3826"/>`).join('') +
			`</g>`
	);
}

/* ---------------------------------------------------------------- render */

/** resvg's wasm is initialised once per process, by the print engine's PNG backend. */
export const initResvg = resvgReady;

/** SVG → PNG at `widthPx` (height follows the SVG's aspect). */
export async function renderSvgToPng(svgText: string, widthPx: number): Promise<{ bytes: Uint8Array; widthPx: number; heightPx: number }> {
	await initResvg();
	const resvg = new Resvg(svgText, { fitTo: { mode: 'width', value: widthPx }, font: { loadSystemFonts: false } });
	const image = resvg.render();
	const out = { bytes: image.asPng(), widthPx: image.width, heightPx: image.height };
	image.free();
	resvg.free();
	return out;
}

/** One demo illustration and where it goes. */
export interface DemoArtPiece {
	key: string;
	fileName: string;
	svg: string;
	/** Printed size of the slot the art was drawn for (what the art check measures against). */
	slotMm: SlotMm;
	widthPx: number;
	status: ArtStatus;
	assignments: ArtAssignment[];
}

export interface DemoArt extends Omit<DemoArtPiece, 'svg' | 'widthPx'> {
	bytes: Uint8Array;
	sha256: string;
	mime: 'image/png';
	widthPx: number;
	heightPx: number;
}

/** Portrait box on movement and wager cards, and hazard icon box: sizes the demo art is drawn for. */
export const DEMO_PORTRAIT_MM: SlotMm = { widthMm: 50, heightMm: 50 };
export const DEMO_ICON_MM: SlotMm = { widthMm: 30, heightMm: 30 };

/** Aim above the 300 dpi minimum so rounding never dips under it. */
const AIM_DPI = 320;

const kindById = (id: string) => DEMO_KINDS.find((k) => k.id === id)!;
const face = (k: CardKind) => faceWithBleedMm(k.size, k.bleed);
const backFor = (ids: string[]): ArtAssignment[] => ids.map((targetId) => ({ scope: 'kind', targetId, slot: 'backArt' }));

/** Every demo illustration, before rendering. */
export function demoArtPieces(): DemoArtPiece[] {
	const pieces: DemoArtPiece[] = DEMO_RUNNERS.map((r) => ({
		key: `portrait-${r.id}`,
		fileName: `snail-${r.name.toLowerCase()}.png`,
		svg: snailSvg(r.colourHex, r.symbol),
		slotMm: DEMO_PORTRAIT_MM,
		// Pebble's portrait is an early low-resolution delivery: the art check must flag it.
		widthPx: r.id === 'rn-pebble' ? 150 : pxForPrint(DEMO_PORTRAIT_MM.widthMm, AIM_DPI),
		status: r.id === 'rn-pebble' ? 'placeholder' : 'final',
		assignments: [{ scope: 'runner', targetId: r.id, slot: 'portrait' }]
	}));
	pieces.push({
		key: `portrait-${DEMO_ROGUE.id}`,
		fileName: 'beetle-burrowback.png',
		svg: beetleSvg(DEMO_ROGUE.colourHex, DEMO_ROGUE.symbol),
		slotMm: DEMO_PORTRAIT_MM,
		widthPx: pxForPrint(DEMO_PORTRAIT_MM.widthMm, AIM_DPI),
		status: 'sketch',
		assignments: [{ scope: 'runner', targetId: DEMO_ROGUE.id, slot: 'portrait' }]
	});

	const backs: { key: string; fileName: string; kinds: string[]; draw: (w: number, h: number) => string; lowRes?: boolean }[] = [
		// Movement and beetle cards are shuffled together: one back for both.
		{ key: 'back-leaf', fileName: 'back-leaf.png', kinds: ['kd-movement', 'kd-rogue'], draw: leafBackSvg },
		{ key: 'back-coin', fileName: 'back-coin.png', kinds: ['kd-wager'], draw: coinBackSvg },
		{ key: 'back-pebble', fileName: 'back-pebble.png', kinds: ['kd-setup', 'kd-aid'], draw: (w, h) => pebbleBackSvg(w, h) },
		// Deliberately coarse, so the art warning has something to show.
		{ key: 'back-dew', fileName: 'back-dew.png', kinds: ['kd-hazard'], draw: dewBackSvg, lowRes: true }
	];
	for (const b of backs) {
		const slot = face(kindById(b.kinds[0]));
		pieces.push({
			key: b.key,
			fileName: b.fileName,
			svg: b.draw(slot.widthMm, slot.heightMm),
			slotMm: slot,
			widthPx: b.lowRes ? 150 : pxForPrint(slot.widthMm, AIM_DPI),
			status: b.lowRes ? 'placeholder' : 'final',
			assignments: backFor(b.kinds)
		});
	}

	const tile = face(kindById('kd-tile'));
	pieces.push({
		key: 'tile-soil',
		fileName: 'tile-soil.png',
		svg: soilSvg(tile.widthMm, tile.heightMm),
		slotMm: tile,
		widthPx: pxForPrint(tile.widthMm, AIM_DPI),
		status: 'final',
		assignments: [{ scope: 'kind', targetId: 'kd-tile', slot: 'ground' }]
	});

	const icons: [string, string, string][] = [
		['hz-dew', 'icon-dew-trail.png', dewTrailIconSvg()],
		['hz-leaf', 'icon-fallen-leaf.png', fallenLeafIconSvg()],
		['hz-thistle', 'icon-thistle.png', thistleIconSvg()],
		['hz-bootprint', 'icon-boot-print.png', bootPrintIconSvg()]
	];
	for (const [id, fileName, art] of icons)
		pieces.push({
			key: `icon-${id}`,
			fileName,
			svg: art,
			slotMm: DEMO_ICON_MM,
			widthPx: pxForPrint(DEMO_ICON_MM.widthMm, AIM_DPI),
			status: 'final',
			assignments: [{ scope: 'card', targetId: `kd-hazard.${id}`, slot: 'icon' }]
		});
	return pieces;
}

/** Renders every demo illustration to PNG, keyed by piece key. */
export async function renderDemoArt(): Promise<Map<string, DemoArt>> {
	const out = new Map<string, DemoArt>();
	for (const piece of demoArtPieces()) {
		const png = await renderSvgToPng(piece.svg, piece.widthPx);
		const { svg: _svg, widthPx: _w, ...rest } = piece;
		out.set(piece.key, {
			...rest,
			bytes: png.bytes,
			sha256: sha256Hex(png.bytes),
			mime: 'image/png',
			widthPx: png.widthPx,
			heightPx: png.heightPx
		});
	}
	return out;
}

/** The demo game with its art assets, and the art bytes by SHA-256 (ready for `writeBundle`). */
export async function demoGameWithArt(): Promise<{ game: Game; art: Map<string, Uint8Array> }> {
	const rendered = await renderDemoArt();
	const game = demoGame();
	const bytes = new Map<string, Uint8Array>();
	const assets: ArtAsset[] = [];
	for (const piece of rendered.values()) {
		bytes.set(piece.sha256, piece.bytes);
		piece.assignments.forEach((assignment, i) =>
			assets.push({
				id: `art-${piece.key}${piece.assignments.length > 1 ? `-${i + 1}` : ''}`,
				sha256: piece.sha256,
				mime: piece.mime,
				widthPx: piece.widthPx,
				heightPx: piece.heightPx,
				status: piece.status,
				fileName: piece.fileName,
				assignment
			})
		);
	}
	return { game: { ...game, art: assets }, art: bytes };
}
