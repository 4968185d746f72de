import { fail } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { forgotSchema } from '$lib/schemas/account';
import { startPasswordReset } from '$lib/server/users';
import { mailPasswordReset, sendLater } from '$lib/server/notify';
import { db } from '$lib/server/runtime';

export const load = async () => ({ form: await superValidate(zod4(forgotSchema)) });

export const actions = {
	default: async ({ request }) => {
		const form = await superValidate(request, zod4(forgotSchema));
		if (!form.valid) return fail(400, { form });
		// Looked up and mailed after the answer: the same answer, in the same time, either way, so
		// the form does not tell who has an account.
		const d = await db();
		sendLater(
			startPasswordReset(d, form.data.email).then(
				(reset) => reset && mailPasswordReset({ to: reset.user.email, name: reset.user.name, token: reset.token })
			)
		);
		return message(form, 'If an account uses this address, a reset link is on its way.');
	}
};
