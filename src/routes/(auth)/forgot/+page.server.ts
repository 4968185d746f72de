import { fail } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { forgotSchema } from '$lib/schemas/account';
import { startPasswordReset } from '$lib/server/users';
import { mailPasswordReset } from '$lib/server/notify';
import { db } from '$lib/server/runtime';

export const load = async () => ({ form: await superValidate(zod4(forgotSchema)) });

export const actions = {
	default: async ({ request }) => {
		const form = await superValidate(request, zod4(forgotSchema));
		if (!form.valid) return fail(400, { form });
		const reset = await startPasswordReset(await db(), form.data.email);
		if (reset) await mailPasswordReset({ to: reset.user.email, name: reset.user.name, token: reset.token });
		// The same answer either way, so the form does not tell who has an account.
		return message(form, 'If an account uses this address, a reset link is on its way.');
	}
};
