import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { proofArtFile } from '$lib/server/http/art-file';

/** An art file the proof's snapshot uses (printers may read released proofs), or its thumbnail with ?thumb=1. */
export const GET: RequestHandler = api(proofArtFile);
