import { apiError } from '$lib/server/http/api';

/** Anything under /api/ that no route takes answers a JSON 404. */
const notFound = () => apiError(404, 'No such API route');
export const GET = notFound;
export const POST = notFound;
export const PUT = notFound;
export const PATCH = notFound;
export const DELETE = notFound;
