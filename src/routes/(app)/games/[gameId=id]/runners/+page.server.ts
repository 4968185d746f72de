import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireGameRole } from '$lib/server/guard';
import { loadGame } from '$lib/server/game-store';
import { saveObjectAction, deleteObjectAction } from '$lib/server/object-actions';
import { db } from '$lib/server/runtime';
import { RunnerSchema, newId, type Runner } from '$lib/game/model';

export const load = async ({ locals, params, url }) => {
	const d = await db();
	await requireGameRole(d, locals, params.gameId, 'game.read');
	const game = await loadGame(d, params.gameId);
	const chosen = game.runners.find((r) => r.id === url.searchParams.get('runner'));
	const blank: Runner = {
		id: newId(),
		name: '',
		colourHex: '#808080',
		cmyk: { c: 0, m: 0, y: 0, k: 50 },
		symbol: 'dot',
		sortOrder: game.runners.length
	};
	const editing = chosen ?? (url.searchParams.has('new') || game.runners.length === 0 ? blank : game.runners[0]);
	return {
		runners: game.runners,
		rogue: game.rogueRunner ?? null,
		isNew: !chosen && editing === blank,
		form: await superValidate(editing, zod4(RunnerSchema), { errors: false })
	};
};

export const actions = {
	save: (event) => saveObjectAction(event, 'runner'),
	delete: (event) => deleteObjectAction(event, 'runner')
};
