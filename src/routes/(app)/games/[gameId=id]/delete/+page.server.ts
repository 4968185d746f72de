import { fail, redirect } from '@sveltejs/kit';
import { requireGameRole } from '$lib/server/http/guard';
import { deleteGame, DeleteGameSchema, whatGoes } from '$lib/server/game-lifecycle';
import { Invalid } from '$lib/server/refusals';
import { db } from '$lib/server/runtime';

/** The owner's page for deleting the game: what goes with it, and the name typed to confirm. */
export const load = async ({ locals, params }) => {
	const d = await db();
	await requireGameRole(d, locals, params.gameId, 'game.delete');
	return { goes: await whatGoes(d, params.gameId) };
};

export const actions = {
	default: async ({ locals, params, request }) => {
		const d = await db();
		const { game, actor } = await requireGameRole(d, locals, params.gameId, 'game.delete');
		const form = await request.formData();
		const parsed = DeleteGameSchema.safeParse({ confirm: String(form.get('confirm') ?? '') });
		if (!parsed.success) return fail(400, { message: 'Type the game’s name to delete it. Nothing was deleted.', confirm: '' });
		try {
			await deleteGame(d, actor, parsed.data);
		} catch (e) {
			if (e instanceof Invalid) return fail(400, { message: e.message, confirm: parsed.data.confirm });
			throw e;
		}
		redirect(303, `/teams/${game.teamId}?deleted=${encodeURIComponent(game.name)}`);
	}
};
