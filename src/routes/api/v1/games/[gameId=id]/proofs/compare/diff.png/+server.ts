import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { proofFaceDiff } from '$lib/server/http/proof-face';

export const GET: RequestHandler = api((event) => proofFaceDiff(event));
