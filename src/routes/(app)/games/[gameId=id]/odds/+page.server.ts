import { fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireGameRole } from '$lib/server/http/guard';
import { loadGame, saveSettings } from '$lib/server/game-store';
import { listScenarios, playerCounts } from '$lib/server/odds';
import { db } from '$lib/server/runtime';
import { DEFAULT_RACE_RULES, RaceRulesSchema } from '$lib/game/model';
import { raceSetupFromGame, RaceSetupError } from '$lib/odds/race';
import { answerFor } from '$lib/server/http/answers';

/** The Odds tab: what the track editor, the deck picker and the wager table need. */
export const load = async ({ locals, params }) => {
	const d = await db();
	const { actor } = await requireGameRole(d, locals, params.gameId, 'game.read');
	const game = await loadGame(d, params.gameId);
	const counts = playerCounts(game);
	// Track length per player count (from the setup card and the tiles); unusable setups are listed with their reason.
	const setups = counts.map((players) => {
		try {
			const s = raceSetupFromGame(game, players);
			return { players, finish: s.finish, sharedCards: s.sharedCards, faceUpCards: s.faceUpCards, rogueToDeck: s.rogueToDeck, problem: null };
		} catch (e) {
			if (e instanceof RaceSetupError) return { players, finish: 0, sharedCards: 0, faceUpCards: 0, rogueToDeck: 0, problem: e.message };
			throw e;
		}
	});
	const movement = game.cards.flatMap((c) =>
		c.data.type === 'movement' ? [{ runner: c.data.runnerId, steps: c.data.steps, copies: c.copies }] : c.data.type === 'rogue' && game.rogueRunner ? [{ runner: game.rogueRunner.id, steps: c.data.steps, copies: c.copies }] : []
	);
	const modifiers = game.cards.flatMap((c) => (c.data.type === 'modifier' ? [{ id: c.id, name: c.data.name, steps: c.data.steps }] : []));
	const rules = game.raceRules ?? DEFAULT_RACE_RULES;
	return {
		runners: [...game.runners].sort((a, b) => a.sortOrder - b.sortOrder).map((r) => ({ id: r.id, name: r.name, colourHex: r.colourHex, symbol: r.symbol })),
		rogue: game.rogueRunner ? { id: game.rogueRunner.id, name: game.rogueRunner.name, colourHex: game.rogueRunner.colourHex, symbol: game.rogueRunner.symbol } : null,
		moneyTables: game.moneyTables.map((t) => ({ id: t.id, name: t.name })),
		setups,
		movement,
		modifiers,
		rules,
		rulesForm: await superValidate(rules, zod4(RaceRulesSchema), { id: 'rules', errors: false }),
		scenarios: await listScenarios(d, actor)
	};
};

export const actions = {
	/** The race rules the odds lab plays by (part of the game, its bundle and its proofs). */
	rules: async ({ locals, params, request }) => {
		const d = await db();
		const { actor } = await requireGameRole(d, locals, params.gameId, 'game.edit');
		const form = await superValidate(request, zod4(RaceRulesSchema), { id: 'rules' });
		if (!form.valid) return fail(400, { rulesForm: form });
		try {
			// Three numbers saved whole: the last save wins (no version to go stale).
			await saveSettings(d, actor, { settings: { raceRules: form.data }, baseVersion: null });
		} catch (e) {
			const refused = answerFor(e);
			if (refused) return message(form, refused.message, { status: refused.status });
			throw e;
		}
		return message(form, 'Rules saved.');
	}
};
