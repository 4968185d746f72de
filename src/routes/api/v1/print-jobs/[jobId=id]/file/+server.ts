import type { RequestHandler } from './$types';
import { api, ApiError } from '$lib/server/api';
import { requireUser } from '$lib/server/guard';
import { jobFor, fileResponse } from '$lib/server/printing';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const user = requireUser(locals);
	const job = jobFor(user.id, params.jobId);
	if (job.state === 'failed') throw new ApiError(job.error?.status ?? 500, job.error?.message ?? 'The build failed');
	if (job.state !== 'done' || !job.result) throw new ApiError(409, 'The file is not ready yet');
	return fileResponse(job.result.bytes, 'application/pdf', job.fileName, job.result.warnings);
});
