import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { proofFaceSvg } from '$lib/server/http/proof-face';

export const GET: RequestHandler = api((event) => proofFaceSvg(event, 'back'));
