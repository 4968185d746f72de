import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { softProofPng } from '$lib/server/http/soft-proof';

export const GET: RequestHandler = api(softProofPng);
