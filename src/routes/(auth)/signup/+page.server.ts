import { fail, redirect } from '@sveltejs/kit';
import { superValidate, setError, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { signUpSchema } from '$lib/schemas/account';
import { CredentialsSignin, safeNext, signInWithPassword } from '$lib/server/http/authjs';
import { currentClient } from '$lib/server/auth/client-address';
import { recordSignUpClash, signUpRefused } from '$lib/server/auth/throttle';
import { createUser, EmailTakenError } from '$lib/server/users';
import { mailAccountExists, sendLater } from '$lib/server/notify';
import { db } from '$lib/server/runtime';

export const load = async ({ locals, url }) => {
	if (locals.user) redirect(303, safeNext(url.searchParams.get('next')));
	return { form: await superValidate(zod4(signUpSchema)) };
};

export const actions = {
	default: async (event) => {
		const form = await superValidate(event.request, zod4(signUpSchema));
		if (!form.valid) return fail(400, { form });
		const d = await db();
		const { address } = currentClient();
		if (await signUpRefused(d, address)) {
			form.data.password = '';
			return message(form, 'Too many attempts from this network. Wait 15 minutes and try again.', { status: 429 });
		}
		const signInAfter = () =>
			signInWithPassword(event, {
				email: form.data.email,
				password: form.data.password,
				redirectTo: safeNext(event.url.searchParams.get('next'))
			});
		try {
			await createUser(d, form.data);
		} catch (e) {
			if (!(e instanceof EmailTakenError)) throw e;
			// The holder of the address who gives their own password is signed in, through the same
			// checked and limited door as the sign-in form; so a taken address costs the same time.
			try {
				await signInAfter();
			} catch (failed) {
				if (!(failed instanceof CredentialsSignin)) throw failed;
			}
			// Otherwise the form cannot make the account and must say so; the holder hears of it, and
			// repeated tries from one network are limited, so the form is no cheap address check.
			await recordSignUpClash(d, address);
			sendLater(mailAccountExists({ to: e.holder.email, name: e.holder.name }));
			form.data.password = '';
			return setError(form, 'email', e.message, { status: 409 });
		}
		await signInAfter();
	}
};
