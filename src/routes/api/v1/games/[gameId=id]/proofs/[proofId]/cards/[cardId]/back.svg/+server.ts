import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { proofFaceSvg } from '$lib/server/proof-face-route';

export const GET: RequestHandler = api((event) => proofFaceSvg(event, 'back'));
