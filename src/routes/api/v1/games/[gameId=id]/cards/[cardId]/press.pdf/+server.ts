import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { pressPdf } from '$lib/server/http/print-files';

export const GET: RequestHandler = api(pressPdf);
