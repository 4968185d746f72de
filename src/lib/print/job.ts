/**
 * A whole game's faces for the print jobs: every card's front and back laid out (./layout) with
 * its pictures decoded once, cached by content, and a face's SVG and PNG. The jobs that turn them
 * into files are one module each:
 *
 * - ./sheet-job.ts `buildGamePdf`: the imposed sheet PDF (./sheets.ts), with options checked first.
 * - ./press-job.ts `buildCardPressPdf`: one card's press file with TrimBox and BleedBox (./press.ts).
 * - ./png-job.ts `buildCardsPngZip`: one PNG per card face with bleed, in a zip.
 *
 * The HTTP routes, the CLI (scripts/print.ts) and the worker pool (./pool.ts) all call them, and all
 * parse their options with the same schema (./options.ts). Plain TypeScript with relative imports
 * only: it runs in the app, in `tsx` scripts and in worker threads alike.
 */
import { imageSize } from 'image-size';
import { checkArtResolution, faceWithBleedMm, MIN_PRINT_DPI, shownDpi } from '../game/art-check';
import type { ArtAsset, Card, CardKind, Game } from '../game/model';
import { faceBytes, faceKey, printCache, type PrintCache } from './cache';
import { fontsKey, type PrintDiskCache } from './disk-cache';
import { faceWidthMm, type FaceLayout, type ImageAsset } from './display-list';
import { loadFontFiles, loadFonts, type FontSet } from './fonts';
import { PrintOptionsError, SETS_MAX } from './options';
import { layoutFace, TEMPLATES } from './layout/index';
import { svgToPng } from './png';
import type { SheetFace } from './sheet-plan';
import { renderSvg } from './svg';

export interface RenderFacesOptions {
	kinds?: string[];
	/** Complete sets: multiplies every card's copies. */
	sets?: number;
	onProgress?: (done: number, total: number) => void;
	cache?: PrintCache;
	/** Laid-out faces kept on disk between processes (the CLI's): read before laying out, written after. */
	disk?: PrintDiskCache;
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

export function selectKinds(game: Game, kindIds: string[] | undefined): CardKind[] {
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

export const sizeKey = (f: FaceLayout) => `${f.trimWidthMm}×${f.trimHeightMm}+${f.bleedMm}`;

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
	// The fonts' metrics (and fontkit with them) are loaded only when a face must be laid out.
	let fonts: Promise<FontSet> | undefined;
	const loaded = await loadGameImages(game, art, cache);
	const { images } = loaded;
	// On disk a layout is also keyed by the font files it was measured with (a package update may change them).
	const diskFonts = options.disk && fontsKey(await loadFontFiles());
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
			async () => {
				const kept = options.disk?.readLayout(`${key}|${diskFonts}`);
				if (kept) return kept;
				laidOut++;
				const made = layoutFace({ game, kind, card, side, images, fonts: await (fonts ??= loadFonts()) });
				options.disk?.writeLayout(`${key}|${diskFonts}`, made);
				return made;
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

/** Millimetres for people: at most two decimals. */
export const fmtMm = (v: number) => String(Math.round(v * 100) / 100);

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
