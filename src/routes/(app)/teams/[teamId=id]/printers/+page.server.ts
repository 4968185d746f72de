import { fail, type RequestEvent } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole, may, type TeamActor } from '$lib/server/http/guard';
import { profilesOf, saveProfile, deleteProfile, setPressProfile, clearPressProfile } from '$lib/server/printer-profiles';
import { findTeam } from '$lib/server/teams';
import { PrinterProfileSchema, DEFAULT_PROFILE, PressConditionSchema } from '$lib/schemas/printing';
import { ICC_MAX_BYTES } from '$lib/print/colour/icc';
import { db } from '$lib/server/runtime';
import { isUuid } from '$lib/schemas/ids';
import { answerFor } from '$lib/server/http/answers';

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
		const { actor } = await requireRole(d, locals, params.teamId, 'profile.edit');
		const form = await superValidate(request, zod4(PrinterProfileSchema));
		if (!form.valid) return fail(400, { form });
		try {
			const saved = await saveProfile(d, actor, form.data);
			form.data = saved;
		} catch (e) {
			const refused = answerFor(e);
			if (refused) return message(form, refused.message, { status: refused.status });
			throw e;
		}
		return message(form, 'Saved.');
	},
	/** A printer's own ICC profile and printing condition for one profile: checked before it is kept. */
	icc: async ({ locals, params, request }) => {
		const d = await db();
		const { actor } = await requireRole(d, locals, params.teamId, 'profile.edit');
		const data = await request.formData();
		const id = String(data.get('id') ?? '');
		if (!isUuid(id)) return fail(404, { iccError: 'No such printer profile' });
		const file = data.get('icc');
		if (!(file instanceof File) || file.size === 0) return fail(400, { iccError: 'Choose the ICC profile file' });
		if (file.size > ICC_MAX_BYTES) return fail(400, { iccError: `The file is ${(file.size / 1048576).toFixed(1)} MB; up to ${ICC_MAX_BYTES / 1048576} MB is accepted` });
		const condition = PressConditionSchema.safeParse({
			conditionIdentifier: data.get('conditionIdentifier') ?? '',
			condition: data.get('condition') ?? '',
			totalInkLimitPct: data.get('totalInkLimitPct') || undefined
		});
		if (!condition.success) return fail(400, { iccError: condition.error.issues.map((i) => i.message).join('; ') });
		try {
			await setPressProfile(d, actor, { id, icc: new Uint8Array(await file.arrayBuffer()), condition: condition.data });
		} catch (e) {
			const refused = answerFor(e);
			if (refused) return fail(refused.status, { iccError: refused.message });
			throw e;
		}
		return { iccSaved: id };
	},
	iccReset: (event) => onOneProfile(event, 'iccError', 'iccSaved', (d, actor, id) => clearPressProfile(d, actor, { id })),
	delete: (event) => onOneProfile(event, 'deleteError', 'deleted', (d, actor, id) => deleteProfile(d, actor, { id }))
};

/**
 * The opening and ending two actions share: the profile named by the form's `id`, one service
 * call, and a refusal told under `errorKey` (or the id under `doneKey` when it went through).
 */
async function onOneProfile<E extends string, K extends string>(
	{ locals, params, request }: RequestEvent<{ teamId: string }>,
	errorKey: E,
	doneKey: K,
	run: (d: Awaited<ReturnType<typeof db>>, actor: TeamActor, id: string) => Promise<unknown>
) {
	const d = await db();
	const { actor } = await requireRole(d, locals, params.teamId, 'profile.edit');
	const id = String((await request.formData()).get('id') ?? '');
	if (!isUuid(id)) return fail(404, { [errorKey]: 'No such printer profile' } as Record<E, string>);
	try {
		await run(d, actor, id);
	} catch (e) {
		const refused = answerFor(e);
		if (refused) return fail(refused.status, { [errorKey]: refused.message } as Record<E, string>);
		throw e;
	}
	return { [doneKey]: id } as Record<K, string>;
}
