import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { requireGameRole, may } from '$lib/server/http/guard';
import { gamePressSummary, profilesOf, setGamePressProfile } from '$lib/server/printer-profiles';
import { answerFor } from '$lib/server/http/answers';
import { db } from '$lib/server/runtime';

/** Game settings: the default press profile (readers see it; designers and owners change it). */
export const load = async ({ locals, params }) => {
	const d = await db();
	const { role, game } = await requireGameRole(d, locals, params.gameId, 'game.read');
	return {
		mayEdit: may(role, 'game.edit'),
		pressProfileId: game.pressProfileId,
		press: await gamePressSummary(d, game.teamId, game.pressProfileId),
		profiles: (await profilesOf(d, game.teamId)).map((p) => ({ id: p.id, name: p.name, output: p.output, press: p.press }))
	};
};

/** The form's one field: a printer profile's id, or empty for the built-in profile. */
const PressChoice = z.object({ profile: z.union([z.literal(''), z.uuid('Choose one of the team’s printer profiles')]) });

export const actions = {
	press: async ({ locals, params, request }) => {
		const d = await db();
		const { game, actor } = await requireGameRole(d, locals, params.gameId, 'game.edit');
		const parsed = PressChoice.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { error: parsed.error.issues[0].message });
		try {
			const press = await setGamePressProfile(d, actor, { profileId: parsed.data.profile || null });
			// The answer holds what the page shows of the choice, so the browser loads nothing again.
			return {
				saved: `The game prints PDF/X for ${press.conditionIdentifier} (${press.profileName}) unless a printer profile is chosen.`,
				press,
				pressProfileId: parsed.data.profile || null
			};
		} catch (e) {
			const refused = answerFor(e);
			if (refused) return fail(refused.status, { error: refused.message });
			throw e;
		}
	}
};
