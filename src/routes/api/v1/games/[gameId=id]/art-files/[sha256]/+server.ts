import type { RequestHandler } from './$types';
import { api } from '$lib/server/api';
import { gameArtFile } from '$lib/server/art-file-route';

/** An art file of this game (any version it has had), or its thumbnail with ?thumb=1. */
export const GET: RequestHandler = api(gameArtFile);
