import { fail, redirect } from '@sveltejs/kit';
import { superValidate, setError } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { signUpSchema } from '$lib/schemas/account';
import { safeNext, signInWithPassword } from '$lib/server/auth/authjs';
import { createUser, EmailTakenError } from '$lib/server/users';
import { db } from '$lib/server/runtime';

export const load = async ({ locals, url }) => {
	if (locals.user) redirect(303, safeNext(url.searchParams.get('next')));
	return { form: await superValidate(zod4(signUpSchema)) };
};

export const actions = {
	default: async (event) => {
		const form = await superValidate(event.request, zod4(signUpSchema));
		if (!form.valid) return fail(400, { form });
		try {
			await createUser(await db(), form.data);
		} catch (e) {
			if (e instanceof EmailTakenError) {
				form.data.password = '';
				return setError(form, 'email', e.message, { status: 409 });
			}
			throw e;
		}
		await signInWithPassword(event, {
			email: form.data.email,
			password: form.data.password,
			redirectTo: safeNext(event.url.searchParams.get('next'))
		});
	}
};
