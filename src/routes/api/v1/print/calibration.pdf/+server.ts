import type { RequestHandler } from './$types';
import { api, ApiError } from '$lib/server/api';
import { requireUser } from '$lib/server/guard';
import { fileResponse } from '$lib/server/printing';
import { buildCalibrationPdf } from '$lib/print/calibration';
import { parsePaper, PrintOptionsError } from '$lib/print/options';

/** The duplex calibration sheet (front and back) for `?paper=` and `?duplex=long|short`. */
export const GET: RequestHandler = api(async ({ locals, url }) => {
	requireUser(locals);
	const duplex = url.searchParams.get('duplex') ?? 'long';
	if (duplex !== 'long' && duplex !== 'short') throw new ApiError(400, 'duplex is long or short');
	const margin = Number(url.searchParams.get('margin') ?? 5);
	if (!(margin >= 0 && margin <= 50)) throw new ApiError(400, 'margin is 0 to 50 mm');
	let paper;
	try {
		paper = parsePaper(url.searchParams.get('paper') ?? 'a4');
	} catch (e) {
		if (e instanceof PrintOptionsError) throw new ApiError(400, e.message);
		throw e;
	}
	const pdf = await buildCalibrationPdf({ paper, duplex, marginMm: margin });
	return fileResponse(pdf, 'application/pdf', `calibration-${url.searchParams.get('paper') ?? 'a4'}-${duplex}.pdf`);
});
