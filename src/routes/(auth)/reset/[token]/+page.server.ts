import { fail, redirect } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { resetSchema } from '$lib/schemas/account';
import { finishPasswordReset } from '$lib/server/users';
import { db } from '$lib/server/runtime';

export const load = async ({ params }) => ({
	form: await superValidate({ token: params.token, password: '' }, zod4(resetSchema), { errors: false })
});

export const actions = {
	default: async ({ request, params }) => {
		const form = await superValidate(request, zod4(resetSchema));
		form.data.token = params.token;
		if (!form.valid) return fail(400, { form });
		if (!(await finishPasswordReset(await db(), params.token, form.data.password))) {
			form.data.password = '';
			return message(form, 'This reset link is used, expired or not valid. Ask for a new one.', { status: 400 });
		}
		redirect(303, '/signin?reset=1');
	}
};
