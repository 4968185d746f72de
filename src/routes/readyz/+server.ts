import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { readiness } from '$lib/server/health';

/** Ready for traffic: the database and the file store answer (200), or not (503, with which). */
export const GET: RequestHandler = async () => {
	const r = await readiness();
	return json(r, { status: r.ready ? 200 : 503, headers: { 'cache-control': 'no-store' } });
};
