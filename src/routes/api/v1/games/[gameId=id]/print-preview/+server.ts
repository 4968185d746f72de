import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { printOptions, previewFirstSheet } from '$lib/server/printing';
import { printSource } from '$lib/server/http/print-source';
import { db } from '$lib/server/runtime';

/** The first sheet of a build (same parameters as print.pdf, plus `proof=`) as SVG, with the plan's figures. */
export const GET: RequestHandler = api(async ({ locals, params, url }) => {
	const d = await db();
	const query = new URLSearchParams(url.searchParams);
	const proof = query.get('proof') ?? undefined;
	query.delete('proof');
	const source = await printSource(d, locals, params.gameId, proof);
	const options = await printOptions(d, source, query);
	// A proof's art is served through the proof, which its printers may read; never through the working game.
	const base = `/api/v1/games/${params.gameId}${proof ? `/proofs/${source.proofNumber}` : ''}`;
	return json(await previewFirstSheet(source, options, (sha) => `${base}/art-files/${sha}`));
});
