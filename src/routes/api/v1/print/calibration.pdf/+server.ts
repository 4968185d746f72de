import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { requireUser } from '$lib/server/http/guard';
import { fileResponse } from '$lib/server/http/print-files';
import { buildCalibrationPdf } from '$lib/print/calibration';
import { parsePaper, PrintOptionsError } from '$lib/print/options';
import { Invalid } from '$lib/server/refusals';

/** The duplex calibration sheet (front and back) for `?paper=` and `?duplex=long|short`. */
export const GET: RequestHandler = api(async ({ locals, url }) => {
	requireUser(locals);
	const duplex = url.searchParams.get('duplex') ?? 'long';
	if (duplex !== 'long' && duplex !== 'short') throw new Invalid('duplex is long or short');
	const margin = Number(url.searchParams.get('margin') ?? 5);
	if (!(margin >= 0 && margin <= 50)) throw new Invalid('margin is 0 to 50 mm');
	let paper;
	try {
		paper = parsePaper(url.searchParams.get('paper') ?? 'a4');
	} catch (e) {
		if (e instanceof PrintOptionsError) throw new Invalid(e.message);
		throw e;
	}
	const pdf = await buildCalibrationPdf({ paper, duplex, marginMm: margin });
	return fileResponse(pdf, 'application/pdf', `calibration-${url.searchParams.get('paper') ?? 'a4'}-${duplex}.pdf`);
});
