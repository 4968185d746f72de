import type { RequestHandler } from './$types';
import { json } from '@sveltejs/kit';
import { api, ApiError } from '$lib/server/api';
import { requireUser } from '$lib/server/guard';
import { pressCmykOf, PRESS_COLOUR_NOTE } from '$lib/server/press-colour';
import { HexColourSchema } from '$lib/game/model';

/** GET /api/v1/press-colour?hex=%23rrggbb: a CMYK press colour proposed from a screen colour. */
export const GET: RequestHandler = api(async ({ locals, url }) => {
	requireUser(locals);
	const hex = HexColourSchema.safeParse(url.searchParams.get('hex') ?? '');
	if (!hex.success) throw new ApiError(400, 'Give the screen colour as ?hex=%23rrggbb');
	return json({ cmyk: await pressCmykOf(hex.data), note: PRESS_COLOUR_NOTE });
});
