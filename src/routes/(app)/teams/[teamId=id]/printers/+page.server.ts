import { fail } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole, may } from '$lib/server/guard';
import { profilesOf, saveProfile, deleteProfile, ProfileError } from '$lib/server/printer-profiles';
import { findTeam } from '$lib/server/teams';
import { PrinterProfileSchema, DEFAULT_PROFILE } from '$lib/schemas/printing';
import { db } from '$lib/server/runtime';
import { isUuid } from '$lib/schemas/ids';

export const load = async ({ locals, params, url }) => {
	const d = await db();
	const { role } = await requireRole(d, locals, params.teamId, 'team.read');
	const profiles = await profilesOf(d, params.teamId);
	const chosen = profiles.find((p) => p.id === url.searchParams.get('profile'));
	const editing = chosen ?? (url.searchParams.has('new') || profiles.length === 0 ? DEFAULT_PROFILE : profiles[0]);
	return {
		team: { id: params.teamId, name: (await findTeam(d, params.teamId))!.name },
		profiles,
		mayEdit: may(role, 'profile.edit'),
		form: await superValidate(editing, zod4(PrinterProfileSchema), { errors: false })
	};
};

export const actions = {
	save: async ({ locals, params, request }) => {
		const d = await db();
		const { user } = await requireRole(d, locals, params.teamId, 'profile.edit');
		const form = await superValidate(request, zod4(PrinterProfileSchema));
		if (!form.valid) return fail(400, { form });
		try {
			const saved = await saveProfile(d, params.teamId, form.data, user.id);
			form.data = saved;
		} catch (e) {
			if (e instanceof ProfileError) return message(form, e.message, { status: e.status });
			throw e;
		}
		return message(form, 'Saved.');
	},
	delete: async ({ locals, params, request }) => {
		const d = await db();
		const { user } = await requireRole(d, locals, params.teamId, 'profile.edit');
		const id = String((await request.formData()).get('id') ?? '');
		if (!isUuid(id)) return fail(404, { deleteError: 'No such printer profile' });
		try {
			await deleteProfile(d, params.teamId, id, user.id);
		} catch (e) {
			if (e instanceof ProfileError) return fail(e.status, { deleteError: e.message });
			throw e;
		}
		return { deleted: id };
	}
};
