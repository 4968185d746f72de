import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { previewSoftProof } from '$lib/server/http/soft-proof';

/** The editor's unsaved card as it will print on a press profile. Writes nothing. */
export const POST: RequestHandler = api(async (event) => json(await previewSoftProof(event)));
