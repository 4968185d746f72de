import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireUser } from '$lib/server/guard';
import { oddsJobs } from '$lib/server/odds';

/** A large odds run: its progress, then its answer (`result`). Only the person who started it sees it. */
export const GET: RequestHandler = api(async ({ locals, params }) => {
	const user = requireUser(locals);
	return json(oddsJobs.view(user.id, params.jobId));
});

/** Cancels the run. */
export const DELETE: RequestHandler = api(async ({ locals, params }) => {
	const user = requireUser(locals);
	return json(oddsJobs.cancel(user.id, params.jobId));
});
