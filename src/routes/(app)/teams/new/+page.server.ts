import { fail, redirect } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { teamSchema } from '$lib/schemas/account';
import { actorOf, requireUser } from '$lib/server/http/guard';
import { createTeam } from '$lib/server/teams';
import { db } from '$lib/server/runtime';

export const load = async () => ({ form: await superValidate(zod4(teamSchema)) });

export const actions = {
	default: async ({ request, locals }) => {
		const user = requireUser(locals);
		const form = await superValidate(request, zod4(teamSchema));
		if (!form.valid) return fail(400, { form });
		const team = await createTeam(await db(), actorOf(user), form.data);
		redirect(303, `/teams/${team.id}`);
	}
};
