import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { cardsZip } from '$lib/server/print-routes';

export const GET: RequestHandler = api(cardsZip);
