import { fail } from '@sveltejs/kit';
import { superValidate, message, setError } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { passwordChangeSchema, tokenSchema } from '$lib/schemas/account';
import { actorOf, requireUser } from '$lib/server/http/guard';
import { createApiToken, revokeApiToken, tokensOf } from '$lib/server/api-tokens';
import { endSession, endSessions, openSessions } from '$lib/server/auth/sessions';
import { changePassword } from '$lib/server/users';
import { db } from '$lib/server/runtime';
import { isUuid } from '$lib/schemas/ids';

export const load = async ({ locals }) => {
	const user = requireUser(locals);
	const d = await db();
	const sessions = (await openSessions(d, user.id)).map((s) => ({
		id: s.id,
		userAgent: s.userAgent,
		address: s.address,
		createdAt: s.createdAt,
		lastSeenAt: s.lastSeenAt,
		current: s.id === locals.sessionId
	}));
	return {
		tokens: await tokensOf(d, user.id),
		sessions,
		form: await superValidate(zod4(tokenSchema)),
		passwordForm: await superValidate(zod4(passwordChangeSchema))
	};
};

export const actions = {
	createToken: async ({ request, locals }) => {
		const user = requireUser(locals);
		const form = await superValidate(request, zod4(tokenSchema));
		if (!form.valid) return fail(400, { form });
		const { token } = await createApiToken(await db(), actorOf(user), { name: form.data.name });
		return message(form, token);
	},
	revokeToken: async ({ request, locals }) => {
		const user = requireUser(locals);
		const id = String((await request.formData()).get('id') ?? '');
		if (!isUuid(id) || !(await revokeApiToken(await db(), actorOf(user), { id }))) {
			return fail(404, { revokeError: 'No such token' });
		}
		return { revoked: true };
	},
	endSession: async ({ request, locals }) => {
		const user = requireUser(locals);
		const id = String((await request.formData()).get('id') ?? '');
		if (!isUuid(id) || !(await endSession(await db(), user.id, id))) {
			return fail(404, { sessionError: 'No such session' });
		}
		return { ended: 1 };
	},
	endOtherSessions: async ({ locals }) => {
		const user = requireUser(locals);
		return { ended: await endSessions(await db(), user.id, locals.sessionId) };
	},
	changePassword: async ({ request, locals }) => {
		const user = requireUser(locals);
		const passwordForm = await superValidate(request, zod4(passwordChangeSchema));
		if (!passwordForm.valid) return fail(400, { passwordForm });
		const changed = await changePassword(await db(), {
			userId: user.id,
			current: passwordForm.data.current,
			password: passwordForm.data.password,
			keepSession: locals.sessionId
		});
		passwordForm.data.current = '';
		passwordForm.data.password = '';
		if (!changed) return setError(passwordForm, 'current', 'This is not your current password', { status: 400 });
		return message(passwordForm, 'Your password is changed. Your other sessions are ended.');
	}
};
