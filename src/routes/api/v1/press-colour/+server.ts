import type { RequestHandler } from './$types';
import { json } from '@sveltejs/kit';
import { api } from '$lib/server/http/api';
import { requireUser } from '$lib/server/http/guard';
import { pressCmykOf, PRESS_COLOUR_NOTE } from '$lib/server/press-colour';
import { HexColourSchema } from '$lib/game/model';
import { Invalid } from '$lib/server/refusals';

/** GET /api/v1/press-colour?hex=%23rrggbb: a CMYK press colour proposed from a screen colour. */
export const GET: RequestHandler = api(async ({ locals, url }) => {
	requireUser(locals);
	const hex = HexColourSchema.safeParse(url.searchParams.get('hex') ?? '');
	if (!hex.success) throw new Invalid('Give the screen colour as ?hex=%23rrggbb');
	return json({ cmyk: await pressCmykOf(hex.data), note: PRESS_COLOUR_NOTE });
});
