import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { requireUser } from '$lib/server/guard';
import { jobFor, jobFile } from '$lib/server/print-jobs';
import { db } from '$lib/server/runtime';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const user = requireUser(locals);
	return jobFile(await jobFor(await db(), user.id, params.jobId));
});
