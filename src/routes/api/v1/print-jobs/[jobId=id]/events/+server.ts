import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { requireUser } from '$lib/server/http/guard';
import { jobFor } from '$lib/server/print-jobs';
import { jobEventStream } from '$lib/server/http/job-events';
import { db } from '$lib/server/runtime';

export const GET: RequestHandler = api(async ({ locals, params, request }) => {
	const user = requireUser(locals);
	const database = await db();
	return jobEventStream(database, user.id, await jobFor(database, user.id, params.jobId), request.signal);
});
