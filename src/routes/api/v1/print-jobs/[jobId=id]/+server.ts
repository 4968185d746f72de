import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { requireUser } from '$lib/server/http/guard';
import { jobFor, jobState } from '$lib/server/print-jobs';
import { db } from '$lib/server/runtime';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const user = requireUser(locals);
	return json(jobState(await jobFor(await db(), user.id, params.jobId)));
});
