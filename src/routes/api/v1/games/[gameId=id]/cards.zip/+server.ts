import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { cardsZip } from '$lib/server/http/print-files';

export const GET: RequestHandler = api(cardsZip);
