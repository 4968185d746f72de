import { fail, redirect } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { signInSchema } from '$lib/schemas/account';
import { CredentialsSignin, safeNext, signInWithPassword } from '$lib/server/auth/authjs';
import { signInRefused, recordFailure } from '$lib/server/auth/throttle';
import { db } from '$lib/server/runtime';
import { config } from '$lib/server/config';

export const load = async ({ locals, url }) => {
	if (locals.user) redirect(303, safeNext(url.searchParams.get('next')));
	return {
		form: await superValidate(zod4(signInSchema)),
		demo: config.demo,
		reset: url.searchParams.has('reset')
	};
};

export const actions = {
	default: async (event) => {
		const form = await superValidate(event.request, zod4(signInSchema));
		if (!form.valid) return fail(400, { form });
		const d = await db();
		const ip = event.getClientAddress();
		if (await signInRefused(d, form.data.email, ip)) {
			return message(
				form,
				'Too many failed sign-ins. Wait 15 minutes and try again, or reset your password.',
				{ status: 429 }
			);
		}
		try {
			await signInWithPassword(event, {
				...form.data,
				redirectTo: safeNext(event.url.searchParams.get('next'))
			});
		} catch (e) {
			if (!(e instanceof CredentialsSignin)) throw e;
		}
		await recordFailure(d, form.data.email, ip);
		form.data.password = '';
		return message(form, 'That e-mail address and password do not match an account.', {
			status: 400
		});
	}
};
