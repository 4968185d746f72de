import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { proofArtFile } from '$lib/server/art-file-route';

/** An art file the proof's snapshot uses (printers may read released proofs), or its thumbnail with ?thumb=1. */
export const GET: RequestHandler = api(proofArtFile);
