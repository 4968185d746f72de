/** One PNG per card face with its bleed, in a zip with cards.csv and about.txt; drawn in shares on several workers. */
import { strToU8, zipSync, type Zippable } from 'fflate';
import Papa from 'papaparse';
import type { Game } from '../game/model';
import { printCache, type PrintCache } from './cache';
import { PRINT_SHOP_NOTE } from './cutting-guide';
import { faceHeightMm, faceWidthMm, type FaceLayout } from './display-list';
import { PrintOptionsError } from './options';
import { mmToPx } from './png';
import { fileSlug, uniqueFileParts } from './file-names';
import { renderGameFaces, fmtMm, cachedFacePng } from './job';

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
