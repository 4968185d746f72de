import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { Invalid } from '$lib/server/refusals';
import { requireGameRole } from '$lib/server/http/guard';
import { historyOf, HistoryQuerySchema } from '$lib/server/history';
import { db } from '$lib/server/runtime';

/** The game's changes, newest first: `?collection=cards&objectId=…` for one object's versions, `&limit=`. */
export const GET: RequestHandler = api(async ({ locals, params, url }) => {
	const d = await db();
	await requireGameRole(d, locals, params.gameId, 'game.read');
	const query = HistoryQuerySchema.safeParse(Object.fromEntries(url.searchParams));
	if (!query.success) throw new Invalid('Name a collection (runners, money-tables, kinds, cards, art), an object id and a limit up to 500');
	return json({ history: await historyOf(d, params.gameId, query.data) });
});
