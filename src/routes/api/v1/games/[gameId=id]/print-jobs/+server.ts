import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { PrintJobRequestSchema } from '$lib/server/http/requests';
import { api, readJson } from '$lib/server/http/api';
import { printOptions, logDownload, pngDpi } from '$lib/server/printing';
import { printSource } from '$lib/server/http/print-source';
import { startSheetJob, startPngJob, jobState } from '$lib/server/print-jobs';
import { db } from '$lib/server/runtime';

/** Starts a sheet build or a PNG zip and answers at once with the job to follow. */
export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const input = await readJson(request, PrintJobRequestSchema);
	const source = await printSource(d, locals, params.gameId, input.proof);
	if (input.kind === 'pngs') {
		const kinds = input.query.kinds ? input.query.kinds.split(',').filter(Boolean) : undefined;
		const job = await startPngJob(d, source, { dpi: pngDpi(input.query.dpi), kinds });
		await logDownload(d, source.actor, { what: 'pngs', proofNumber: source.proofNumber });
		return json(jobState(job), { status: 202 });
	}
	const options = await printOptions(d, source, new URLSearchParams(input.query));
	const job = await startSheetJob(d, source, options);
	await logDownload(d, source.actor, { what: 'sheets', proofNumber: source.proofNumber });
	return json(jobState(job), { status: 202 });
});
