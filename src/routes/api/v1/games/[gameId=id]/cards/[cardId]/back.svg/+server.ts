import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { cardFaceSvg } from '$lib/server/http/card-face';

export const GET: RequestHandler = api((event) => cardFaceSvg(event, 'back'));
