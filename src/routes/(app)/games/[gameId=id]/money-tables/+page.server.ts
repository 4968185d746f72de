import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireGame } from '$lib/server/http/guard';
import { saveObjectAction, deleteObjectAction } from '$lib/server/http/object-actions';
import { db } from '$lib/server/runtime';
import { MoneyTableSchema, newId, type MoneyTable } from '$lib/game/model';

export const load = async ({ locals, params, url }) => {
	const d = await db();
	const { doc: game } = await requireGame(d, locals, params.gameId, 'game.read');
	const chosen = game.moneyTables.find((t) => t.id === url.searchParams.get('table'));
	const blank: MoneyTable = { id: newId(), name: '', rows: [{ place: 1, coins: 5 }], otherCoins: -1 };
	const editing = chosen ?? (url.searchParams.has('new') || game.moneyTables.length === 0 ? blank : game.moneyTables[0]);
	// Which wager cards print each table (a change reaches all of them).
	const usedBy: Record<string, number> = {};
	for (const c of game.cards) {
		if (c.data.type === 'wager') usedBy[c.data.moneyTableId] = (usedBy[c.data.moneyTableId] ?? 0) + 1;
	}
	return {
		tables: game.moneyTables,
		runnerCount: game.runners.length,
		usedBy,
		isNew: editing === blank,
		form: await superValidate(editing, zod4(MoneyTableSchema), { errors: false })
	};
};

export const actions = {
	save: (event) => saveObjectAction(event, 'moneyTable'),
	delete: (event) => deleteObjectAction(event, 'moneyTable')
};
