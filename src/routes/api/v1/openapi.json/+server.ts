import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { openApiDocument } from '$lib/server/http/openapi';

/** The API's description; it holds no data, so anyone may read it. */
export const GET: RequestHandler = () => json(openApiDocument());
