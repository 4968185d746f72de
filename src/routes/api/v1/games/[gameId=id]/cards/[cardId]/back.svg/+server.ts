import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { cardFaceSvg } from '$lib/server/card-face-route';

export const GET: RequestHandler = api((event) => cardFaceSvg(event, 'back'));
