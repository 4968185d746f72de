import { fail } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { keepSavedGame, requireGame, requireGameRole } from '$lib/server/http/guard';
import { saveSettings } from '$lib/server/game-store';
import { saveObjectAction, deleteObjectAction } from '$lib/server/http/object-actions';
import { db } from '$lib/server/runtime';
import { RunnerSchema, RogueRunnerSchema, newId, type Runner, type RogueRunner } from '$lib/game/model';
import { newRunnerDefaults } from '$lib/game/runner-defaults';
import { usersOf } from '$lib/game/readiness';
import { pressCmykOf, PRESS_COLOUR_NOTE } from '$lib/server/press-colour';
import { answerFor } from '$lib/server/http/answers';

export const load = async ({ locals, params, url }) => {
	const d = await db();
	const { doc: game } = await requireGame(d, locals, params.gameId, 'game.read');
	const chosen = game.runners.find((r) => r.id === url.searchParams.get('runner'));
	const fresh = newRunnerDefaults(game);
	const blank: Runner = { id: newId(), name: '', ...fresh, cmyk: await pressCmykOf(fresh.colourHex) };
	const editing = chosen ?? (url.searchParams.has('new') || game.runners.length === 0 ? blank : game.runners[0]);
	return {
		runners: game.runners,
		rogue: game.rogueRunner ?? null,
		isNew: !chosen && editing === blank,
		pressColourNote: PRESS_COLOUR_NOTE,
		/** What uses each runner: a runner can be deleted only when nothing does. */
		usedBy: Object.fromEntries(game.runners.map((r) => [r.id, usersOf(game, { collection: 'runner', id: r.id })])),
		form: await superValidate(editing, zod4(RunnerSchema), { errors: false }),
		rogueForm: await superValidate(game.rogueRunner ?? (await blankRogue()), zod4(RogueRunnerSchema), { id: 'rogue', errors: false })
	};
};

const blankRogue = async (): Promise<RogueRunner> => ({
	id: newId(),
	name: '',
	colourHex: '#3a3a3a',
	cmyk: await pressCmykOf('#3a3a3a'),
	symbol: 'cross'
});

export const actions = {
	save: (event) => saveObjectAction(event, 'runner'),
	/** The rogue runner lives in the game's settings, versioned like an object. */
	saveRogue: async (event) => {
		const d = await db();
		const access = await requireGameRole(d, event.locals, event.params.gameId, 'game.edit');
		const form = await superValidate(event.request, zod4(RogueRunnerSchema), { id: 'rogue' });
		if (!form.valid) return fail(400, { rogueForm: form });
		const { version, ...rogueRunner } = form.data;
		let saved;
		try {
			saved = await saveSettings(d, access.actor, { settings: { rogueRunner }, baseVersion: version ?? 0 });
		} catch (e) {
			const refused = answerFor(e);
			if (refused) return message(form, refused.message, { status: refused.status });
			throw e;
		}
		keepSavedGame(event.locals, access, saved.game);
		// The answer holds the rogue runner as saved, with the settings' new version for the next save.
		form.data = saved.game.rogueRunner!;
		form.message = { text: 'Saved.', tone: 'success' as const };
		return { rogueForm: form, saved: saved.game.rogueRunner };
	},
	delete: (event) => deleteObjectAction(event, 'runner')
};
