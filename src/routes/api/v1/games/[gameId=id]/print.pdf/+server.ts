import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { sheetsPdf } from '$lib/server/print-routes';

export const GET: RequestHandler = api(sheetsPdf);
