import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { requireUser } from '$lib/server/http/guard';
import { jobFor } from '$lib/server/print-jobs';
import { jobFileResponse } from '$lib/server/http/print-files';
import { db } from '$lib/server/runtime';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const user = requireUser(locals);
	return jobFileResponse(await jobFor(await db(), user.id, params.jobId));
});
