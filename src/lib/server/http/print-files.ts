/**
 * The download routes of the working game and of a proof share these handlers: the sheet PDF,
 * one card's press PDF and the PNG zip. A proof's files are built from its snapshot only.
 */
import type { RequestEvent } from '@sveltejs/kit';
import { printOptions, artBytes, runPrint, logDownload, sheetsName, pressName, pdfxTarget, buildPngZip, pngDpi, pngZipName } from '../printing';
import { PrintQuerySchema } from '$lib/print/options';
import { isUuid } from '$lib/schemas/ids';
import { printSource } from './print-source';
import { Invalid, NotFound } from '../refusals';
import { db } from '../runtime';
import { jobFile, type PrintJobRow } from '../print-jobs';
import { streamBody } from '../storage';

/** A press file's own choices: plain or PDF/X, and the rendering intent. */
const PressQuerySchema = PrintQuerySchema.pick({ output: true, intent: true });

/** A print file as a download; the header counts the build's warnings for the print page. */
export function fileResponse(bytes: Uint8Array | ReadableStream, type: string, name: string, warnings: string[] = [], length?: number) {
	return new Response(bytes instanceof ReadableStream ? bytes : Buffer.from(bytes), {
		headers: {
			'content-type': type,
			...(length !== undefined ? { 'content-length': String(length) } : {}),
			'content-disposition': `attachment; filename="${name}"`,
			'x-paddock-warnings': String(warnings.length),
			'cache-control': 'private, no-store'
		}
	});
}

/** A finished print job's file, streamed from the store. */
export async function jobFileResponse(job: PrintJobRow) {
	const { file, fileName, warnings } = await jobFile(job);
	return fileResponse(streamBody(file), fileName.endsWith('.zip') ? 'application/zip' : 'application/pdf', fileName, warnings, file.bytes);
}

type Ev = RequestEvent<{ gameId: string; proofId?: string; cardId?: string }>;

export async function sheetsPdf(event: Ev) {
	const d = await db();
	const source = await printSource(d, event.locals, event.params.gameId, event.params.proofId);
	const options = await printOptions(d, source, event.url.searchParams);
	const { onProgress: _none, ...plain } = options;
	const result = await runPrint({ type: 'sheets', isolated: !!source.proofNumber, game: source.game, art: await artBytes(source.game), options: plain });
	await logDownload(d, source.actor, { what: 'sheets', proofNumber: source.proofNumber });
	return fileResponse(result.bytes, 'application/pdf', sheetsName(source, options), result.warnings);
}

export async function pressPdf(event: Ev) {
	const d = await db();
	const source = await printSource(d, event.locals, event.params.gameId, event.params.proofId);
	const cardId = event.params.cardId!;
	if (!source.game.cards.some((c) => c.id === cardId)) throw new NotFound('No such card');
	const query = event.url.searchParams;
	const colour = query.get('colour') === 'rgb' ? 'rgb' : 'cmyk';
	const marks = query.get('marks') === '1';
	const press = PressQuerySchema.safeParse({ output: query.get('output') ?? undefined, intent: query.get('intent') ?? undefined });
	if (!press.success) throw new Invalid(press.error.issues.map((i) => i.message).join('; '));
	const profileId = query.get('profile') ?? undefined;
	if (profileId !== undefined && !isUuid(profileId)) throw new NotFound('No such printer profile in this team');
	const pdfx = await pdfxTarget(d, source, press.data, profileId);
	const result = await runPrint({
		type: 'press',
		isolated: !!source.proofNumber,
		game: source.game,
		art: await artBytes(source.game),
		cardId,
		options: { colour, cropMarks: marks, date: source.date, ...(pdfx ? { pdfx } : {}) }
	});
	await logDownload(d, source.actor, { what: `press:${cardId}`, proofNumber: source.proofNumber });
	return fileResponse(result.bytes, 'application/pdf', pressName(source, cardId), result.warnings);
}

export async function cardsZip(event: Ev) {
	const d = await db();
	const source = await printSource(d, event.locals, event.params.gameId, event.params.proofId);
	const dpi = pngDpi(event.url.searchParams.get('dpi'));
	const result = await buildPngZip(source.game, await artBytes(source.game), { dpi, isolated: !!source.proofNumber });
	await logDownload(d, source.actor, { what: 'pngs', proofNumber: source.proofNumber });
	return fileResponse(result.bytes, 'application/zip', pngZipName(source, dpi), result.warnings);
}
