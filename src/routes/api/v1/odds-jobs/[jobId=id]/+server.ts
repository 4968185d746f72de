import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { actorOf, requireUser } from '$lib/server/http/guard';
import { cancelOddsJob, oddsJobView } from '$lib/server/odds';
import { db } from '$lib/server/runtime';

/** A large odds run: its progress, then its answer (`result`). Only the person who started it sees it. */
export const GET: RequestHandler = api(async ({ locals, params }) => {
	const user = requireUser(locals);
	return json(await oddsJobView(await db(), user.id, params.jobId));
});

/** Cancels the run, whichever process is computing it. */
export const DELETE: RequestHandler = api(async ({ locals, params }) => {
	const user = requireUser(locals);
	return json(await cancelOddsJob(await db(), actorOf(user), { id: params.jobId }));
});
