/**
 * Print files for the app: what to print (the working game, or exactly a proof's snapshot), the
 * options (query parameters or a printer profile), and the builds, which run in the print
 * engine's worker pool so the app stays responsive. Jobs started from the print page are in
 * ./print-jobs.ts.
 */
import { readArtFile } from './art-files';
import { findProfile, pressProfileOf } from './printer-profiles';
import { Busy, Invalid, NotFound } from './refusals';
import { logActivity } from './activity';
import type { Db } from './db';
import type { GameActor } from './actor';
import type { Game } from '$lib/game/model';
import { printPool, PrintBusyError, type PrintJob, type PrintJobResult } from '$lib/print/pool';
import { PNG_DPI_DEFAULT, PNG_DPI_MAX, PNG_DPI_MIN, zipPngParts } from '$lib/print/png-job';
import { renderGameFaces } from '$lib/print/job';
import type { GamePdfOptions } from '$lib/print/sheet-job';
import { parsePrintOptions, PrintOptionsError, settingsQuery, toSheetOptions, type PrintOptions } from '$lib/print/options';
import type { PdfxTarget } from '$lib/print/pdfx';
import type { PaperSpec } from '$lib/print/paper';
import { pngZipFileName, pressFileName, sheetsFileName, type DownloadOf } from '$lib/print/file-names';
import type { PressProfile } from '$lib/print/colour/cmm';
import { builtinPressProfile } from '$lib/print/colour/press-profiles';
import { countPages, planSheets } from '$lib/print/sheet-plan';
import { sheetPreviewSvg } from '$lib/print/preview';
import { isUuid } from '$lib/schemas/ids';
import type { ApiAnswer, PrintPreviewSchema } from '$lib/schemas/api';

export interface PrintSource {
	game: Game;
	gameId: string;
	teamId: string;
	/** Who asked for the print: jobs and downloads are logged in their name. */
	actor: GameActor;
	/** "proof 3" or "working copy", printed in the sheet label. */
	versionLabel: string;
	proofNumber?: number;
	/** Fixed for a proof, so its files come out the same every time. */
	date: string;
	/** The printer profile whose press profile the game's PDF/X files use by default (built-in when unset). */
	pressProfileId?: string;
}

export async function artBytes(game: Game): Promise<Map<string, Uint8Array>> {
	const art = new Map<string, Uint8Array>();
	for (const a of game.art) if (!art.has(a.sha256)) art.set(a.sha256, await readArtFile(a.sha256));
	return art;
}

/** Options from the query: either `profile=<id>` (a printer profile of the team) or the parameters themselves. */
export async function printOptions(db: Db, source: PrintSource, query: URLSearchParams): Promise<GamePdfOptions> {
	const raw: Record<string, string> = Object.fromEntries(query);
	const profileId = raw.profile;
	delete raw.profile;
	let values = raw;
	if (profileId) {
		if (!isUuid(profileId)) throw new NotFound('No such printer profile in this team');
		const profile = await findProfile(db, source.teamId, profileId);
		// The profile's settings; a query may still choose sets, kinds and the kind of file.
		const chosen = Object.fromEntries(['sets', 'kinds', 'output', 'intent'].flatMap((k) => (raw[k] ? [[k, raw[k]]] : [])));
		values = { ...settingsQuery(profile), ...chosen };
	}
	let options;
	try {
		options = parsePrintOptions(values);
	} catch (e) {
		if (e instanceof PrintOptionsError) throw new Invalid(e.message);
		throw e;
	}
	const pdfx = await pdfxTarget(db, source, options, profileId);
	return { ...options, title: source.game.name, versionLabel: source.versionLabel, date: source.date, ...(pdfx ? { pdfx } : {}) };
}

/**
 * The PDF/X target of a request asking for `output=pdfx4|pdfx1a`: the named printer profile's
 * press profile, else the game's default, else the built-in one.
 */
export async function pdfxTarget(
	db: Db,
	source: PrintSource,
	options: Pick<PrintOptions, 'output' | 'intent'>,
	profileId?: string
): Promise<PdfxTarget | undefined> {
	if (!options.output || options.output === 'plain') return undefined;
	const pressId = profileId ?? source.pressProfileId;
	let profile: PressProfile;
	profile = pressId ? await pressProfileOf(db, source.teamId, pressId) : await builtinPressProfile();
	return { standard: options.output, profile, intent: options.intent ?? 'relative' };
}

/**
 * Runs a job in the pool; engine refusals become 400 (or 404), a full pool 503. `admitted`: the
 * job already has its place in the bounded print queue (./job-admission.ts), so the pool takes it
 * whatever its own queue holds.
 */
export async function runPrint(
	job: PrintJob,
	onProgress?: (done: number, total: number) => void,
	{ affinity = job.game.slug, admitted = false }: { affinity?: string; admitted?: boolean } = {}
): Promise<PrintJobResult> {
	try {
		return await printPool().run(job, { onProgress, affinity, admitted });
	} catch (e) {
		if (e instanceof PrintBusyError) throw new Busy(e.message);
		const status = (e as { status?: number }).status;
		// Errors come back from the worker as data: its name and status say which refusal it was.
		if ((e as Error).name === 'PrintOptionsError' || status === 400 || status === 404) {
			throw status === 404 ? new NotFound((e as Error).message) : new Invalid((e as Error).message);
		}
		throw e;
	}
}

export async function logDownload(db: Db, actor: GameActor, { what, proofNumber }: { what: string; proofNumber?: number }) {
	await logActivity(db, {
		teamId: actor.teamId,
		gameId: actor.gameId,
		userId: actor.userId,
		action: 'print.downloaded',
		detail: { what, ...(proofNumber ? { proof: proofNumber } : {}) }
	});
}

/** What a download's name says about where it came from: the game, the version, the day. */
export const downloadOf = (source: PrintSource): DownloadOf => ({ gameName: source.game.name, version: source.versionLabel, date: source.date });

/** The paper as a file-name part: its name, or a custom size in mm. */
const paperPart = (paper: PaperSpec) => (typeof paper === 'string' ? paper : `${paper.widthMm}x${paper.heightMm}mm`);

export const sheetsName = (source: PrintSource, options: Pick<GamePdfOptions, 'paper'>) => sheetsFileName(downloadOf(source), paperPart(options.paper));

/** A card's press file: the game, version, day, then the card's kind and name. */
export function pressName(source: PrintSource, cardId: string): string {
	const card = source.game.cards.find((c) => c.id === cardId);
	const kind = source.game.kinds.find((k) => k.id === card?.kindId);
	return pressFileName(downloadOf(source), kind?.name ?? 'cards', card?.name ?? 'card');
}

/** The first sheet of a build as SVG, with the plan's figures, for the print page (art linked, not embedded). */
export async function previewFirstSheet(
	source: PrintSource,
	options: GamePdfOptions,
	artUrl: (sha256: string) => string
): Promise<ApiAnswer<typeof PrintPreviewSchema>> {
	const faces = await renderGameFaces(source.game, await artBytes(source.game), { kinds: options.kinds, sets: options.sets });
	const sheetOptions = toSheetOptions(options);
	let plan;
	try {
		plan = planSheets({ faces: faces.cards, options: sheetOptions });
	} catch (e) {
		throw new Invalid((e as Error).message);
	}
	const pages = countPages(plan, !!sheetOptions.cuttingGuide);
	const group = plan.groups[0];
	if (!group) throw new Invalid('Nothing to print: the chosen card kinds have no cards with copies');
	const page = group.pages[0];
	const known = new Set(faces.images.keys());
	const svg = sheetPreviewSvg(group, page, (id) => (known.has(id) ? artUrl(id) : undefined), options.marks);
	return {
		svg,
		sheets: plan.sheetCount,
		pages: pages.total,
		guidePages: pages.guidePages,
		cardsPerSheet: group.imposition.cardsPerSheet,
		columns: group.imposition.columns,
		rows: group.imposition.rows,
		orientation: group.imposition.orientation,
		warnings: [...faces.warnings, ...plan.warnings]
	};
}

/* ---------------------------------------------------------- PNG zips */

export interface PngJobOptions {
	dpi: number;
	kinds?: string[];
}

/** The resolution asked for a PNG zip (default 300), or 400. */
export function pngDpi(value: string | null | undefined): number {
	const dpi = Number(value ?? PNG_DPI_DEFAULT);
	if (!Number.isInteger(dpi) || dpi < PNG_DPI_MIN || dpi > PNG_DPI_MAX) throw new Invalid(`dpi is a whole number from ${PNG_DPI_MIN} to ${PNG_DPI_MAX}`);
	return dpi;
}

export const pngZipName = (source: PrintSource, dpi: number) => pngZipFileName(downloadOf(source), dpi);

/**
 * A PNG zip drawn on every print worker at once: each draws a share of the faces (and keeps
 * them in its cache, so the next zip of an unchanged game only collects them); the zip is put
 * together here. A share goes back to the worker that drew it last, where its faces are kept.
 */
export async function buildPngZip(
	game: Game,
	art: Map<string, Uint8Array>,
	options: PngJobOptions & { isolated?: boolean; admitted?: boolean },
	onProgress?: (done: number, total: number) => void
): Promise<PrintJobResult> {
	pngDpi(String(options.dpi));
	const count = printPool().size;
	const progress = Array.from({ length: count }, () => ({ done: 0, total: 0, heard: false }));
	const parts = await Promise.all(
		progress.map((p, index) =>
			runPrint(
				{ type: 'png-part', isolated: options.isolated, game, art, options: { dpi: options.dpi, kinds: options.kinds, shard: { index, count } } },
				(done, total) => {
					Object.assign(p, { done, total, heard: true });
					// The whole count is known once every share has told its own: before that a
					// growing total would move the bar backwards.
					if (progress.some((x) => !x.heard)) return;
					onProgress?.(
						progress.reduce((n, x) => n + x.done, 0),
						progress.reduce((n, x) => n + x.total, 0)
					);
				},
				{ affinity: `${game.slug}#png${index}`, admitted: options.admitted }
			)
		)
	);
	const zip = zipPngParts(parts.map((p) => p.part!));
	return { ...parts[0], type: 'pngs', part: undefined, bytes: zip.zip, files: zip.files, warnings: zip.warnings };
}
