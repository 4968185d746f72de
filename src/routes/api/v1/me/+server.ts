import type { RequestHandler } from './$types';
import { json } from '@sveltejs/kit';
import { api } from '$lib/server/http/api';
import { requireUser } from '$lib/server/http/guard';
import { db } from '$lib/server/runtime';
import { membershipsOf } from '$lib/server/teams';
import type { ApiAnswer, MeSchema } from '$lib/schemas/api';

export const GET: RequestHandler = api(async ({ locals }) => {
	const user = requireUser(locals);
	const memberships = await membershipsOf(await db(), user.id);
	return json({ user: { id: user.id, email: user.email, name: user.name }, memberships } satisfies ApiAnswer<typeof MeSchema>);
});
