import { fail } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { tokenSchema } from '$lib/schemas/account';
import { requireUser } from '$lib/server/guard';
import { createApiToken, revokeApiToken, tokensOf } from '$lib/server/api-tokens';
import { db } from '$lib/server/runtime';
import { isUuid } from '$lib/schemas/ids';

export const load = async ({ locals }) => {
	const user = requireUser(locals);
	return {
		tokens: await tokensOf(await db(), user.id),
		form: await superValidate(zod4(tokenSchema))
	};
};

export const actions = {
	createToken: async ({ request, locals }) => {
		const user = requireUser(locals);
		const form = await superValidate(request, zod4(tokenSchema));
		if (!form.valid) return fail(400, { form });
		const { token } = await createApiToken(await db(), user.id, form.data.name);
		return message(form, token);
	},
	revokeToken: async ({ request, locals }) => {
		const user = requireUser(locals);
		const id = String((await request.formData()).get('id') ?? '');
		if (!isUuid(id) || !(await revokeApiToken(await db(), user.id, id))) {
			return fail(404, { revokeError: 'No such token' });
		}
		return { revoked: true };
	}
};
