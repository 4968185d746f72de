/** The imposed sheet PDF of a game: options checked, faces laid out, sheets planned, then drawn (./sheets.ts). */
import type { Game } from '../game/model';
import { printCache, type PrintCache } from './cache';
import { faceHeightMm, faceWidthMm, type FaceLayout } from './display-list';
import { loadFontFiles } from './fonts';
import { fontRecordsIn, keepDrawnForms, restoreForms, type PrintDiskCache } from './disk-cache';
import { keepFontRecords, saveFontRecords } from './pdf-fontkit';
import { impose } from './impose';
import { checkPrintOptions, DEFAULT_MARGIN_MM, PrintOptionsError, toSheetOptions, type PrintOptions } from './options';
import { paperSize, type PaperSpec } from './paper';
import { countPages, planSheets } from './sheet-plan';
import { buildSheetPdf } from './sheets';
import type { PdfxTarget } from './pdfx';
import { loadGameImages, renderGameFaces, type RenderedCard, selectKinds, sizeKey, fmtMm } from './job';
import { encodeImagesAhead } from './pdf-image';
import { pressBuild, pictureWords, inkWarning } from './press-checks';

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
	/** Faces, their drawn forms, art pixels and font records kept on disk between processes (the CLI's). */
	disk?: PrintDiskCache;
}

export interface GamePdf {
	pdf: Uint8Array;
	/** Physical sheets of paper (a duplex sheet has two pages). */
	sheets: number;
	/** Every page of the document, the cutting guide's included (`guidePages` of them). */
	pages: number;
	guidePages: number;
	warnings: string[];
}

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
	const disk = options.disk;
	keepFontRecords(disk && fontRecordsIn(disk));
	// A process that prints one file (the CLI, with its disk cache) compresses the pictures on
	// libuv's threads while this one lays out the faces. Press files convert theirs (./press.ts).
	const picturesAhead = disk && !options.pdfx ? await encodeImagesAhead((await loadGameImages(game, art, cache)).images.values(), disk) : undefined;
	const faces = await renderGameFaces(game, art, {
		kinds: kinds.map((k) => k.id),
		cache,
		disk,
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
	const fonts = await loadFontFiles();
	await picturesAhead?.compressed;
	// Forms are kept for plain RGB or CMYK; a press file draws its own (subset fonts, the profile's colours).
	const keepForms = disk && !options.pdfx ? sheetOptions.colour : undefined;
	const drawn = keepForms ? restoreForms(disk!, distinctFaces(faces.cards), keepForms, fonts) : undefined;
	const pdf = await pressBuild(async () =>
		buildSheetPdf({
			title: options.title ?? game.name,
			versionLabel: options.versionLabel ?? 'draft',
			date: options.date ?? new Date().toISOString().slice(0, 10),
			faces: faces.cards,
			images: faces.images,
			options: sheetOptions,
			fonts,
			imageStore: disk ?? cache,
			onPage: (d) => report(d),
			pdfx: options.pdfx,
			onInkOver: (what, pct, imageId) => ink.push(inkWarning(imageId ? pictureWords(game, imageId, faces.cards) : what, pct, options.pdfx!))
		})
	);
	if (disk) {
		if (drawn?.size) keepDrawnForms(disk, drawn, keepForms!, fonts);
		saveFontRecords();
		if (Object.values(disk.stats.written).some(Boolean)) disk.trim();
	}
	return { pdf, sheets: plan.sheetCount, pages: pageTotal, guidePages: count.guidePages, warnings: [...faces.warnings, ...plan.warnings, ...ink] };
}

/** Each distinct face of the cards with its content key (a shared back once). */
function distinctFaces(cards: RenderedCard[]): Map<FaceLayout, string> {
	const faces = new Map<FaceLayout, string>();
	for (const c of cards) {
		faces.set(c.front, c.frontKey);
		if (c.back && c.backKey) faces.set(c.back, c.backKey);
	}
	return faces;
}

