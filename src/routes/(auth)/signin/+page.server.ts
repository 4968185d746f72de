import { fail, redirect } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { signInSchema } from '$lib/schemas/account';
import { CredentialsSignin, SignInLimited, SIGN_IN_LIMITED_MESSAGE, safeNext, signInWithPassword } from '$lib/server/http/authjs';
import { config } from '$lib/server/config';

export const load = async ({ locals, url }) => {
	if (locals.user) redirect(303, safeNext(url.searchParams.get('next')));
	return {
		form: await superValidate(zod4(signInSchema)),
		demo: config.demo,
		reset: url.searchParams.has('reset'),
		// Auth.js sends a refused sign-in back here with its code.
		limited: url.searchParams.get('code') === 'rate_limited' ? SIGN_IN_LIMITED_MESSAGE : null
	};
};

export const actions = {
	default: async (event) => {
		const form = await superValidate(event.request, zod4(signInSchema));
		if (!form.valid) return fail(400, { form });
		// The limit is counted and enforced where the password is checked (Auth.js's authorize).
		try {
			await signInWithPassword(event, {
				...form.data,
				redirectTo: safeNext(event.url.searchParams.get('next'))
			});
		} catch (e) {
			if (!(e instanceof CredentialsSignin)) throw e;
			form.data.password = '';
			if (e instanceof SignInLimited) return message(form, SIGN_IN_LIMITED_MESSAGE, { status: 429 });
		}
		form.data.password = '';
		return message(form, 'That e-mail address and password do not match an account.', {
			status: 400
		});
	}
};
