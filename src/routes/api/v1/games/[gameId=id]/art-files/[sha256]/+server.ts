import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { gameArtFile } from '$lib/server/http/art-file';

/** An art file of this game (any version it has had), or its thumbnail with ?thumb=1. */
export const GET: RequestHandler = api(gameArtFile);
