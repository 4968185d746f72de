/**
 * Print files for the app: what to print (the working game, or exactly a proof's snapshot), the
 * options (query parameters or a printer profile), and the builds, which run in the print
 * engine's worker pool so the app stays responsive. Jobs started from the print page are in
 * ./print-jobs.ts.
 */
import { requireGameRole, may } from './guard';
import { ApiError } from './api';
import { loadGame } from './game-store';
import { readArtFile } from './art-files';
import { requireProof } from './proof-access';
import { snapshotOf } from './proofs';
import { findProfile } from './printer-profiles';
import { logActivity } from './activity';
import type { Db } from './db';
import type { Game } from '$lib/game/model';
import { printPool, PrintBusyError, type PrintJob, type PrintJobResult } from '$lib/print/pool';
import { renderGameFaces, type GamePdfOptions } from '$lib/print/job';
import { parsePrintOptions, PrintOptionsError, settingsQuery, toSheetOptions } from '$lib/print/options';
import { planSheets } from '$lib/print/sheet-plan';
import { sheetPreviewSvg } from '$lib/print/preview';
import { isUuid } from '$lib/schemas/ids';

export interface PrintSource {
	game: Game;
	gameId: string;
	teamId: string;
	userId: string;
	/** "proof 3" or "working copy", printed in the sheet label. */
	versionLabel: string;
	proofNumber?: number;
	/** Fixed for a proof, so its files come out the same every time. */
	date: string;
}

/** The working game (readers of the game) or a proof (printers: released proofs only). */
export async function printSource(db: Db, locals: App.Locals, gameId: string, proofKey?: string): Promise<PrintSource> {
	if (proofKey) {
		const { proof, user, game } = await requireProof(db, locals, gameId, proofKey);
		return {
			game: snapshotOf(proof),
			gameId,
			teamId: game.teamId,
			userId: user.id,
			versionLabel: `proof ${proof.number}`,
			proofNumber: proof.number,
			date: proof.createdAt.toISOString().slice(0, 10)
		};
	}
	const { user, game, role } = await requireGameRole(db, locals, gameId, 'release.read');
	if (!may(role, 'game.read')) throw new ApiError(403, 'Printers print released proofs; open the proof to download its files');
	return {
		game: await loadGame(db, gameId),
		gameId,
		teamId: game.teamId,
		userId: user.id,
		versionLabel: `working copy v${game.version}`,
		date: new Date().toISOString().slice(0, 10)
	};
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
		if (!isUuid(profileId)) throw new ApiError(404, 'No such printer profile in this team');
		const profile = await findProfile(db, source.teamId, profileId);
		// The profile's settings; a query may still choose sets and kinds.
		values = { ...settingsQuery(profile), ...(raw.sets ? { sets: raw.sets } : {}), ...(raw.kinds ? { kinds: raw.kinds } : {}) };
	}
	try {
		return { ...parsePrintOptions(values), title: source.game.name, versionLabel: source.versionLabel, date: source.date };
	} catch (e) {
		if (e instanceof PrintOptionsError) throw new ApiError(400, e.message);
		throw e;
	}
}

/** Runs a job in the pool; engine refusals become 400 (or 404), a full queue 503. */
export async function runPrint(job: PrintJob, onProgress?: (done: number, total: number) => void): Promise<PrintJobResult> {
	try {
		return await printPool().run(job, { onProgress, affinity: job.game.slug });
	} catch (e) {
		if (e instanceof PrintBusyError) throw new ApiError(503, e.message, 'busy');
		const status = (e as { status?: number }).status;
		if ((e as Error).name === 'PrintOptionsError' || status === 400 || status === 404) {
			throw new ApiError(status === 404 ? 404 : 400, (e as Error).message);
		}
		throw e;
	}
}

export async function logDownload(db: Db, source: PrintSource, what: string) {
	await logActivity(db, {
		teamId: source.teamId,
		gameId: source.gameId,
		userId: source.userId,
		action: 'print.downloaded',
		detail: { what, ...(source.proofNumber ? { proof: source.proofNumber } : {}) }
	});
}

export function fileResponse(bytes: Uint8Array, type: string, name: string, warnings: string[] = []) {
	return new Response(Buffer.from(bytes), {
		headers: {
			'content-type': type,
			'content-disposition': `attachment; filename="${name}"`,
			'x-paddock-warnings': String(warnings.length),
			'cache-control': 'private, no-store'
		}
	});
}

export const fileStem = (source: PrintSource) =>
	`${source.game.slug}${source.proofNumber ? `-proof-${source.proofNumber}` : ''}`;

/** The first sheet of a build as SVG, with the plan's figures, for the print page (art linked, not embedded). */
export async function previewFirstSheet(source: PrintSource, options: GamePdfOptions, artUrl: (sha256: string) => string) {
	const faces = await renderGameFaces(source.game, await artBytes(source.game), { kinds: options.kinds, sets: options.sets });
	let plan;
	try {
		plan = planSheets({ faces: faces.cards, options: toSheetOptions(options) });
	} catch (e) {
		throw new ApiError(400, (e as Error).message);
	}
	const group = plan.groups[0];
	if (!group) throw new ApiError(400, 'Nothing to print: the chosen card kinds have no cards with copies');
	const page = group.pages[0];
	const known = new Set(faces.images.keys());
	const svg = sheetPreviewSvg(group, page, (id) => (known.has(id) ? artUrl(id) : undefined), options.marks);
	return {
		svg,
		sheets: plan.sheetCount,
		pages: plan.groups.reduce((n, g) => n + g.pages.length, 0),
		cardsPerSheet: group.imposition.cardsPerSheet,
		columns: group.imposition.columns,
		rows: group.imposition.rows,
		orientation: group.imposition.orientation,
		warnings: [...faces.warnings, ...plan.warnings]
	};
}
