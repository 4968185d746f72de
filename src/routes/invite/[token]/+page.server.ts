import { error, fail, redirect } from '@sveltejs/kit';
import { db } from '$lib/server/runtime';
import { acceptInvitation, findInvitation } from '$lib/server/teams';
import { actorOf, requireUser } from '$lib/server/http/guard';
import { answerFor } from '$lib/server/http/answers';

async function lookUp(token: string) {
	try {
		return await findInvitation(await db(), token);
	} catch (e) {
		const refused = answerFor(e);
		if (refused) error(refused.status, refused.message);
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
			const invitation = await acceptInvitation(await db(), actorOf(user), { token: params.token });
			redirect(303, `/teams/${invitation.teamId}`);
		} catch (e) {
			const refused = answerFor(e);
			if (refused) return fail(refused.status, { error: refused.message });
			throw e;
		}
	}
};
