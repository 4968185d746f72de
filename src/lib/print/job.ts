/**
 * Print jobs: a whole game (data + art bytes) → the files a designer, playtester or print shop
 * downloads. The HTTP routes, the CLI (scripts/print.ts) and the worker pool (./pool.ts) all call
 * these functions, and all parse their options with the same schema (./options.ts).
 *
 * - `renderGameFaces`: every card's front and back laid out (./layout), cached by content.
 * - `buildGamePdf`: the imposed sheet PDF (./sheets.ts), with options checked first.
 * - `buildCardPressPdf`: one card's press file with TrimBox and BleedBox (./press.ts).
 * - `buildCardsPngZip`: one PNG per card face at 300 dpi with bleed, in a zip.
 *
 * Plain TypeScript with relative imports only: it runs in the app, in `tsx` scripts and in
 * worker threads alike.
 */
import { strToU8, zipSync, type Zippable } from 'fflate';
import { imageSize } from 'image-size';
import Papa from 'papaparse';
import { checkArtResolution, faceWithBleedMm, MIN_PRINT_DPI, shownDpi } from '../game/art-check';
import type { ArtAsset, Card, CardKind, Game } from '../game/model';
import { faceBytes, faceKey, printCache, type PrintCache } from './cache';
import { PRINT_SHOP_NOTE } from './cutting-guide';
import { faceHeightMm, faceWidthMm, type FaceLayout, type ImageAsset } from './display-list';
import { loadFonts } from './fonts';
import { impose } from './impose';
import { checkPrintOptions, DEFAULT_MARGIN_MM, PrintOptionsError, SETS_MAX, toSheetOptions, type PrintOptions } from './options';
import { layoutFace, TEMPLATES } from './layout/index';
import { paperSize, type PaperSpec } from './paper';
import type { ColourMode } from './pdf';
import { mmToPx, svgToPng } from './png';
import { buildPressPdf } from './press';
import { countPages, planSheets, type SheetFace } from './sheet-plan';
import { fileSlug, uniqueFileParts } from './file-names';
import { buildSheetPdf } from './sheets';
import { PressImageError } from './pdf-image';
import type { PdfxTarget } from './pdfx';
import { renderSvg } from './svg';

/** A sheet PDF request: what to print and how (./options.ts), and how this run reports. */
export interface GamePdfOptions extends PrintOptions {
	title?: string;
	versionLabel?: string;
	/** As the sheet label should read it; today (UTC) when absent. */
	date?: string;
	/** PDF/X for a press profile (colour is then the profile's CMYK). */
	pdfx?: PdfxTarget;
	onProgress?: (done: number, total: number) => void;
	cache?: PrintCache;
}

export interface RenderFacesOptions {
	kinds?: string[];
	/** Complete sets: multiplies every card's copies. */
	sets?: number;
	onProgress?: (done: number, total: number) => void;
	cache?: PrintCache;
}

/* ---------------------------------------------------------------- images */

/** Decoding guard: past this a picture is refused before it is decoded (100 MP ≈ 400 MB of RGBA). */
export const MAX_IMAGE_PIXELS = 100_000_000;
/** SVG art is rasterised for print at this resolution over the game's largest face (common practice). */
export const SVG_ART_DPI = 300;

export interface GameImages {
	/** By content hash (ArtAsset.sha256), as the layout looks them up. */
	images: Map<string, ImageAsset>;
	warnings: string[];
}

/**
 * The game's art as images the backends can draw: PNG and JPEG as they are (size read from the
 * header, not trusted from the record), SVG rasterised once. Art without bytes, or too large
 * to decode, is left out with a warning; its slots draw a placeholder.
 */
export async function loadGameImages(game: Game, art: ReadonlyMap<string, Uint8Array>, cache: PrintCache = printCache): Promise<GameImages> {
	const images = new Map<string, ImageAsset>();
	const warnings: string[] = [];
	const seen = new Set<string>();
	// Vector art is drawn at a size good for the game's largest face.
	const largestFaceMm = Math.max(40, ...game.kinds.map((k) => Math.max(faceWithBleedMm(k.size, k.bleed).widthMm, faceWithBleedMm(k.size, k.bleed).heightMm)));
	for (const asset of game.art) {
		if (seen.has(asset.sha256)) continue;
		seen.add(asset.sha256);
		const bytes = art.get(asset.sha256);
		if (!bytes) {
			warnings.push(`art “${asset.fileName}” has no file; its slots show a placeholder`);
			continue;
		}
		try {
			const image = await cache.getOrMake(
				'image',
				`${asset.sha256}:${asset.mime}:${bytes.length}:${asset.mime === 'image/svg+xml' ? largestFaceMm : ''}`,
				() => loadImage(asset, bytes, largestFaceMm),
				(img) => img.bytes.length + 128
			);
			images.set(asset.sha256, image);
		} catch (e) {
			warnings.push(`art “${asset.fileName}” cannot be printed: ${(e as Error).message}; its slots show a placeholder`);
		}
	}
	return { images, warnings };
}

async function loadImage(asset: ArtAsset, bytes: Uint8Array, largestFaceMm: number): Promise<ImageAsset> {
	if (asset.mime === 'image/svg+xml') {
		const svg = new TextDecoder().decode(bytes);
		const png = await svgToPng(svg, { widthMm: largestFaceMm, dpi: SVG_ART_DPI });
		return { id: asset.sha256, mime: 'image/png', bytes: png.png, widthPx: png.widthPx, heightPx: png.heightPx };
	}
	let header: { width?: number; height?: number; type?: string };
	try {
		header = imageSize(bytes);
	} catch {
		throw new Error('the file is not a readable PNG or JPEG');
	}
	const mime = header.type === 'png' ? 'image/png' : header.type === 'jpg' ? 'image/jpeg' : undefined;
	if (!mime || !header.width || !header.height) throw new Error(`the file is ${header.type ?? 'unknown'}, not PNG or JPEG`);
	if (header.width * header.height > MAX_IMAGE_PIXELS)
		throw new Error(`${header.width} × ${header.height} px is more than ${MAX_IMAGE_PIXELS / 1e6} megapixels`);
	return { id: asset.sha256, mime, bytes, widthPx: header.width, heightPx: header.height };
}

/* ----------------------------------------------------------------- faces */

export interface RenderedCard extends SheetFace {
	cardId: string;
	cardName: string;
	kindId: string;
	/** Content keys of the faces (see ./cache.ts), for caches further down. */
	frontKey: string;
	backKey?: string;
	/** True when the back is the kind's one shared back (the same FaceLayout for every card). */
	sharedBack: boolean;
}

export interface GameFaces {
	/** Grouped by face size (trim + bleed), in the game's order within a size. */
	cards: RenderedCard[];
	images: Map<string, ImageAsset>;
	warnings: string[];
	/** How many faces were laid out (not found in the cache). */
	laidOut: number;
}

function selectKinds(game: Game, kindIds: string[] | undefined): CardKind[] {
	if (!kindIds?.length) return game.kinds;
	const byId = new Map(game.kinds.map((k) => [k.id, k]));
	return [...new Set(kindIds)].map((id) => {
		const k = byId.get(id);
		if (!k) throw new PrintOptionsError(`This game has no card kind “${id}”`);
		return k;
	});
}

/** A shared back drawn by the plain back module needs no card: lay it out once per kind. */
function backIsShared(kind: CardKind): boolean {
	return kind.back.mode === 'shared' && (TEMPLATES.get(kind.back.template)?.face ?? 'back') === 'back';
}

const sizeKey = (f: FaceLayout) => `${f.trimWidthMm}×${f.trimHeightMm}+${f.bleedMm}`;

/**
 * Every printable card of the chosen kinds with both faces laid out, copies multiplied by
 * `sets`. Faces come from the cache when nothing they are made from has changed; the same
 * FaceLayout object is returned for every copy and for every card sharing a back, so the PDF
 * draws each once.
 */
export async function renderGameFaces(game: Game, art: ReadonlyMap<string, Uint8Array>, options: RenderFacesOptions = {}): Promise<GameFaces> {
	const cache = options.cache ?? printCache;
	const sets = options.sets ?? 1;
	if (!Number.isInteger(sets) || sets < 1 || sets > SETS_MAX) throw new PrintOptionsError(`sets is 1 to ${SETS_MAX}`);
	const kinds = selectKinds(game, options.kinds);
	const [fonts, loaded] = await Promise.all([loadFonts(), loadGameImages(game, art, cache)]);
	const { images } = loaded;
	const warnings = [...loaded.warnings];

	const jobs: { kind: CardKind; card: Card }[] = [];
	for (const kind of kinds) for (const card of game.cards) if (card.kindId === kind.id && card.copies > 0) jobs.push({ kind, card });
	const sharedKinds = new Set(kinds.filter((k) => backIsShared(k) && jobs.some((j) => j.kind === k)).map((k) => k.id));
	const total = jobs.length * 2 - jobs.filter((j) => sharedKinds.has(j.kind.id)).length + sharedKinds.size;
	let done = 0;
	let laidOut = 0;
	const face = async (kind: CardKind, card: Card | undefined, side: 'front' | 'back') => {
		const key = faceKey(game, kind, card, side, images);
		const layout = await cache.getOrMake(
			'layout',
			key,
			() => {
				laidOut++;
				return layoutFace({ game, kind, card, side, images, fonts });
			},
			faceBytes
		);
		options.onProgress?.(++done, total);
		return { key, layout };
	};

	const sharedBacks = new Map<string, { key: string; layout: FaceLayout }>();
	for (const kind of kinds) if (sharedKinds.has(kind.id)) sharedBacks.set(kind.id, await face(kind, undefined, 'back'));

	const cards: RenderedCard[] = [];
	for (const { kind, card } of jobs) {
		const front = await face(kind, card, 'front');
		const back = sharedBacks.get(kind.id) ?? (await face(kind, card, 'back'));
		cards.push({
			cardId: card.id,
			cardName: card.name,
			kindId: kind.id,
			kindKey: kind.name,
			front: front.layout,
			back: back.layout,
			frontKey: front.key,
			backKey: back.key,
			sharedBack: sharedKinds.has(kind.id),
			copies: card.copies * sets
		});
	}
	const seenWarnings = new Set(warnings);
	const note = (w: string) => {
		if (seenWarnings.has(w)) return;
		seenWarnings.add(w);
		warnings.push(w);
	};
	for (const c of cards) for (const w of [...c.front.warnings, ...(c.back?.warnings ?? [])]) note(w);
	for (const w of artResolutionWarnings(game, cards, images)) note(w);

	// Group by size (first-seen order), keeping the game's order inside each group.
	const order = new Map<string, number>();
	for (const c of cards) if (!order.has(sizeKey(c.front))) order.set(sizeKey(c.front), order.size);
	const grouped = cards.map((c, i) => ({ c, i })).sort((a, b) => order.get(sizeKey(a.c.front))! - order.get(sizeKey(b.c.front))! || a.i - b.i);
	return { cards: grouped.map((g) => g.c), images, warnings, laidOut };
}

/**
 * Art that prints soft: the resolution each image really gets at the size the layout placed it
 * (a cover-fitted image is placed larger than its slot, so this is what the printer sees).
 */
function artResolutionWarnings(game: Game, cards: RenderedCard[], images: Map<string, ImageAsset>): string[] {
	const names = new Map(game.art.map((a) => [a.sha256, a.fileName]));
	const out: string[] = [];
	const seen = new Set<FaceLayout>();
	for (const c of cards)
		for (const face of [c.front, c.back]) {
			if (!face || seen.has(face)) continue;
			seen.add(face);
			for (const item of face.items) {
				if (item.type !== 'image') continue;
				const img = images.get(item.imageId);
				if (!img) continue;
				// The clip box is the slot the art fills: the same measure as the art page's.
				const box = item.clip ?? item;
				const { dpi, ok } = checkArtResolution(img, { widthMm: box.wMm, heightMm: box.hMm });
				if (!ok)
					out.push(
						`${c.kindKey}: art “${names.get(item.imageId) ?? item.imageId}” prints at ${shownDpi(dpi)} dpi; ` +
							`${MIN_PRINT_DPI} dpi is common practice for print`
					);
			}
		}
	return out;
}

/* ------------------------------------------------------------ sheet PDF */

export interface GamePdf {
	pdf: Uint8Array;
	/** Physical sheets of paper (a duplex sheet has two pages). */
	sheets: number;
	/** Every page of the document, the cutting guide's included (`guidePages` of them). */
	pages: number;
	guidePages: number;
	warnings: string[];
}

const fmtMm = (v: number) => String(Math.round(v * 100) / 100);

function paperWords(spec: PaperSpec): string {
	const p = paperSize(spec);
	return typeof spec === 'string' ? p.label : `a ${p.label} sheet`;
}

/** Refuse sizes that cannot be imposed, naming the kinds and their size with bleed. */
function checkFit(cards: RenderedCard[], o: Required<Pick<GamePdfOptions, 'paper' | 'marginMm' | 'layout'>>): void {
	const sheet = paperSize(o.paper);
	if (o.marginMm * 2 >= sheet.widthMm)
		throw new PrintOptionsError(`A ${fmtMm(o.marginMm)} mm margin leaves no printable area on ${paperWords(o.paper)}`);
	const groups = new Map<string, { face: FaceLayout; kinds: Set<string> }>();
	for (const c of cards) {
		const k = sizeKey(c.front);
		if (!groups.has(k)) groups.set(k, { face: c.front, kinds: new Set() });
		groups.get(k)!.kinds.add(c.kindKey);
	}
	for (const { face, kinds } of groups.values()) {
		const fit = impose({
			sheet,
			marginMm: o.marginMm,
			trimWidthMm: face.trimWidthMm,
			trimHeightMm: face.trimHeightMm,
			bleedMm: face.bleedMm,
			layout: o.layout
		});
		if (fit.ok) continue;
		const w = faceWidthMm(face);
		const h = faceHeightMm(face);
		const size =
			o.layout === 'fold'
				? `${fmtMm(2 * face.trimWidthMm + 2 * face.bleedMm)} × ${fmtMm(h)} mm with bleed, front and back side by side`
				: `${fmtMm(w)} × ${fmtMm(h)} mm with bleed`;
		throw new PrintOptionsError(
			`${[...kinds].join(', ')} (${size}) do not fit inside ${paperWords(o.paper)}’s printable area with a ${fmtMm(o.marginMm)} mm margin`
		);
	}
}

/** The imposed sheet PDF of a game. Progress counts faces laid out, then pages drawn. */
export async function buildGamePdf(game: Game, art: ReadonlyMap<string, Uint8Array>, options: GamePdfOptions): Promise<GamePdf> {
	checkPrintOptions(options);
	const cache = options.cache ?? printCache;
	const marginMm = options.marginMm ?? DEFAULT_MARGIN_MM;
	const kinds = selectKinds(game, options.kinds);
	// Face progress is the first part of the whole; pages (known once planned) the rest.
	let faceTotal = 0;
	let faceDone = 0;
	let pageTotal = 0;
	const report = (pagesDone: number) => options.onProgress?.(faceDone + pagesDone, faceTotal + pageTotal);
	const faces = await renderGameFaces(game, art, {
		kinds: kinds.map((k) => k.id),
		cache,
		onProgress: (d, t) => {
			faceDone = d;
			faceTotal = t;
			report(0);
		}
	});
	if (!faces.cards.length) throw new PrintOptionsError('Nothing to print: the chosen card kinds have no cards with copies');
	checkFit(faces.cards, { paper: options.paper, marginMm, layout: options.layout });

	const sheetOptions = toSheetOptions(options);
	const plan = planSheets({ faces: faces.cards, options: sheetOptions });
	const count = countPages(plan, !!sheetOptions.cuttingGuide);
	pageTotal = count.total;
	const ink: string[] = [];
	const pdf = await pressBuild(async () =>
		buildSheetPdf({
			title: options.title ?? game.name,
			versionLabel: options.versionLabel ?? 'draft',
			date: options.date ?? new Date().toISOString().slice(0, 10),
			faces: faces.cards,
			images: faces.images,
			options: sheetOptions,
			fonts: await loadFonts(),
			imageStore: cache,
			onPage: (d) => report(d),
			pdfx: options.pdfx,
			onInkOver: (what, pct, imageId) => ink.push(inkWarning(imageId ? pictureWords(game, imageId, faces.cards) : what, pct, options.pdfx!))
		})
	);
	return { pdf, sheets: plan.sheetCount, pages: pageTotal, guidePages: count.guidePages, warnings: [...faces.warnings, ...plan.warnings, ...ink] };
}

/* ------------------------------------------------------------ press PDF */

export interface CardPressOptions {
	colour?: ColourMode;
	/** PDF/X for a press profile (colour is then the profile's CMYK). */
	pdfx?: PdfxTarget;
	cropMarks?: boolean;
	/** YYYY-MM-DD, the document's date (a proof's date keeps its press files the same bytes). */
	date?: string;
	cache?: PrintCache;
}

function findCard(game: Game, cardId: string): { card: Card; kind: CardKind } {
	const card = game.cards.find((c) => c.id === cardId);
	if (!card) throw new PrintOptionsError(`This game has no card “${cardId}”`, 404);
	const kind = game.kinds.find((k) => k.id === card.kindId);
	if (!kind) throw new PrintOptionsError(`Card “${card.name}” belongs to a missing card kind`);
	return { card, kind };
}

/** One card's press file: front on page 1, back on page 2, TrimBox and BleedBox set (CMYK unless asked). */
export async function buildCardPressPdf(
	game: Game,
	art: ReadonlyMap<string, Uint8Array>,
	cardId: string,
	options: CardPressOptions = {}
): Promise<{ pdf: Uint8Array; warnings: string[] }> {
	const { card, kind } = findCard(game, cardId);
	const cache = options.cache ?? printCache;
	const [fonts, { images, warnings }] = await Promise.all([loadFonts(), loadGameImages(game, art, cache)]);
	const layout = (side: 'front' | 'back') =>
		cache.getOrMake('layout', faceKey(game, kind, card, side, images), () => layoutFace({ game, kind, card, side, images, fonts }), faceBytes);
	const front = await layout('front');
	const back = await layout('back');
	const ink: string[] = [];
	const pdf = await pressBuild(() =>
		buildPressPdf({
			title: `${game.name} — ${card.name}`,
			front,
			back,
			images,
			colour: options.colour ?? 'cmyk',
			cropMarks: options.cropMarks ?? false,
			fonts,
			imageStore: cache,
			date: options.date,
			pdfx: options.pdfx,
			onInkOver: (what, pct, imageId) =>
				ink.push(inkWarning(imageId ? pictureWords(game, imageId, [{ cardName: card.name, front, back }]) : what, pct, options.pdfx!))
		})
	);
	return { pdf, warnings: [...warnings, ...front.warnings, ...back.warnings, ...ink] };
}

/** A press standard's refusal (transparency in PDF/X-1a) is a refusal of the request, not a failure. */
async function pressBuild<T>(build: () => Promise<T>): Promise<T> {
	try {
		return await build();
	} catch (e) {
		if (e instanceof PressImageError) throw new PrintOptionsError(`This game cannot be PDF/X-1a: ${e.message}`);
		throw e;
	}
}

/** A picture in a warning: its file name and the cards it is on (a few by name, then a count). */
function pictureWords(game: Game, imageId: string, cards: { cardName: string; front: FaceLayout; back?: FaceLayout }[]): string {
	const file = game.art.find((a) => a.sha256 === imageId)?.fileName ?? imageId.slice(0, 12);
	const uses = (f?: FaceLayout) => !!f?.items.some((i) => i.type === 'image' && i.imageId === imageId);
	const names = [...new Set(cards.filter((c) => uses(c.front) || uses(c.back)).map((c) => `“${c.cardName}”`))];
	const shown = names.slice(0, 3).join(', ') + (names.length > 3 ? ` and ${names.length - 3} more` : '');
	return `the picture “${file}”${names.length ? ` on ${names.length === 1 ? 'card' : 'cards'} ${shown}` : ''}`;
}

/** The total-ink warning: what, how much, the limit and where the limit comes from. */
function inkWarning(what: string, pct: number, pdfx: PdfxTarget): string {
	const p = pdfx.profile;
	return (
		`${what} prints with ${Math.round(pct)} % total ink, over the ${p.totalInkLimitPct} % limit of ${p.conditionIdentifier}; ` +
		`the press may smear or set off there (lighten the rich black or the colour)`
	);
}

/* -------------------------------------------------------------- PNG zip */

export interface PngZipOptions {
	dpi?: number;
	kinds?: string[];
	onProgress?: (done: number, total: number) => void;
	cache?: PrintCache;
}

/** Per-card raster files: 300 dpi is common practice for card printing. */
export const PNG_DPI_DEFAULT = 300;
export const PNG_DPI_MIN = 72;
export const PNG_DPI_MAX = 600;

/** A face's SVG with its images inlined, cached by the face's content key. */
export function cachedFaceSvg(face: FaceLayout, key: string, images: Map<string, ImageAsset>, cache: PrintCache = printCache): Promise<string> {
	return cache.getOrMake('svg', key, () => renderSvg(face, images), (s) => s.length * 2);
}

/** A face's PNG at `dpi` with bleed, cached by the face's content key and the resolution. */
export async function cachedFacePng(
	face: FaceLayout,
	key: string,
	images: Map<string, ImageAsset>,
	dpi: number,
	cache: PrintCache = printCache
): Promise<Uint8Array> {
	return cache.getOrMake(
		'png',
		`${key}@${dpi}`,
		async () => (await svgToPng(await cachedFaceSvg(face, key, images, cache), { widthMm: faceWidthMm(face), dpi })).png,
		(b) => b.length
	);
}

/** A fixed date keeps the zip's bytes the same for the same game (no clock in the output). */
const ZIP_MTIME = new Date(2000, 0, 1);

/** One share of a PNG zip's work: `index` of `count` (faces i with i % count === index). */
export interface PngShard {
	index: number;
	count: number;
}

/** A part of a PNG zip: its faces' files and, from the first share, cards.csv and about.txt. */
export interface PngPart {
	files: [path: string, bytes: Uint8Array][];
	warnings: string[];
	/** Distinct face files in the whole zip. */
	total: number;
}

/**
 * One PNG per card face with its bleed: `<kind>/<card>-front.png`, `<card>-back.png` for a
 * per-card back, `<kind>/back.png` for a kind's shared back; `cards.csv` lists which files make
 * each card and how many copies; `about.txt` gives size, resolution and the print-shop caution.
 */
export async function buildCardsPngZip(
	game: Game,
	art: ReadonlyMap<string, Uint8Array>,
	options: PngZipOptions = {}
): Promise<{ zip: Uint8Array; files: number; warnings: string[] }> {
	return zipPngParts([await renderPngPart(game, art, options)]);
}

/** The zip of every part's files (PNG is compressed already: stored as it is). */
export function zipPngParts(parts: PngPart[]): { zip: Uint8Array; files: number; warnings: string[] } {
	const files: Zippable = {};
	const entries = parts.flatMap((p) => p.files).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
	for (const [path, bytes] of entries) files[path] = [bytes, { level: path.endsWith('.png') ? 0 : 6, mtime: ZIP_MTIME }];
	const pngs = entries.filter(([path]) => path.endsWith('.png')).length;
	return { zip: zipSync(files), files: pngs, warnings: parts[0]?.warnings ?? [] };
}

/**
 * The files of a PNG zip, or one share of them (`shard`), so several workers can draw the faces
 * of one zip at once. Every share lays out the whole game (cheap, and cached); the first share
 * also writes cards.csv and about.txt.
 */
export async function renderPngPart(
	game: Game,
	art: ReadonlyMap<string, Uint8Array>,
	options: PngZipOptions & { shard?: PngShard } = {}
): Promise<PngPart> {
	const dpi = options.dpi ?? PNG_DPI_DEFAULT;
	if (!Number.isInteger(dpi) || dpi < PNG_DPI_MIN || dpi > PNG_DPI_MAX)
		throw new PrintOptionsError(`dpi is a whole number from ${PNG_DPI_MIN} to ${PNG_DPI_MAX}`);
	const shard = options.shard ?? { index: 0, count: 1 };
	const cache = options.cache ?? printCache;
	const faces = await renderGameFaces(game, art, { kinds: options.kinds, cache });
	if (!faces.cards.length) throw new PrintOptionsError('Nothing to export: the chosen card kinds have no cards with copies');

	const rows: Record<string, string | number>[] = [];
	const written = new Set<string>();
	// Folders by kind name, files by card name (from the whole game, so every share names alike).
	const kindDirs = uniqueFileParts(game.kinds, 'cards');
	const cardFiles = new Map(game.kinds.flatMap((k) => [...uniqueFileParts(game.cards.filter((c) => c.kindId === k.id), 'card')]));
	const jobs: { path: string; face: FaceLayout; key: string }[] = [];
	for (const c of faces.cards) {
		const dir = kindDirs.get(c.kindId)!;
		const file = cardFiles.get(c.cardId) ?? fileSlug(c.cardName, 'card');
		const front = `${dir}/${file}-front.png`;
		const back = c.back ? (c.sharedBack ? `${dir}/back.png` : `${dir}/${file}-back.png`) : '';
		jobs.push({ path: front, face: c.front, key: c.frontKey });
		if (c.back && c.backKey) jobs.push({ path: back, face: c.back, key: c.backKey });
		rows.push({
			kind: c.kindKey,
			card: c.cardName,
			id: c.cardId,
			copies: c.copies,
			front,
			back,
			widthMm: c.front.trimWidthMm,
			heightMm: c.front.trimHeightMm,
			bleedMm: c.front.bleedMm
		});
	}
	const unique = jobs.filter((j) => !written.has(j.path) && written.add(j.path));
	const mine = unique.filter((_, i) => i % shard.count === shard.index);
	const files: PngPart['files'] = [];
	let done = 0;
	for (const j of mine) {
		files.push([j.path, await cachedFacePng(j.face, j.key, faces.images, dpi, cache)]);
		options.onProgress?.(++done, mine.length);
	}
	if (shard.index === 0) {
		files.push(['cards.csv', strToU8(Papa.unparse(rows))]);
		const sizes = new Map<string, string>();
		for (const c of faces.cards) {
			const f = c.front;
			// The rasteriser rounds each side on its own (./png.ts).
			const px = `${mmToPx(faceWidthMm(f), dpi)} × ${mmToPx(faceHeightMm(f), dpi)} px`;
			sizes.set(
				c.kindId,
				`${c.kindKey}: ${fmtMm(f.trimWidthMm)} × ${fmtMm(f.trimHeightMm)} mm trim + ${fmtMm(f.bleedMm)} mm bleed each side, ` +
					`${fmtMm(faceWidthMm(f))} × ${fmtMm(faceHeightMm(f))} mm = ${px}`
			);
		}
		const about = [
			`${game.name}: card faces as PNG at ${dpi} dpi, each with its bleed on every side.`,
			...sizes.values(),
			'cards.csv lists the front and back file of every card and how many copies to print.',
			'',
			PRINT_SHOP_NOTE,
			''
		].join('\n');
		files.push(['about.txt', strToU8(about)]);
	}
	return { files, warnings: faces.warnings, total: unique.length };
}
