import { error, fail, redirect } from '@sveltejs/kit';
import { db } from '$lib/server/runtime';
import { acceptInvitation, findInvitation, TeamError } from '$lib/server/teams';
import { requireUser } from '$lib/server/guard';

async function lookUp(token: string) {
	try {
		return await findInvitation(await db(), token);
	} catch (e) {
		if (e instanceof TeamError) error(e.status, e.message);
		throw e;
	}
}

export const load = async ({ params, locals }) => {
	const invitation = await lookUp(params.token);
	return {
		teamName: invitation.teamName,
		role: invitation.role,
		email: invitation.email,
		signedInAs: locals.user?.email ?? null
	};
};

export const actions = {
	accept: async ({ params, locals }) => {
		const user = requireUser(locals);
		try {
			const invitation = await acceptInvitation(await db(), params.token, user);
			redirect(303, `/teams/${invitation.teamId}`);
		} catch (e) {
			if (e instanceof TeamError) return fail(e.status, { error: e.message });
			throw e;
		}
	}
};
