import { fail, redirect } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { gameCreateSchema } from '$lib/schemas/account';
import { requireRole, may } from '$lib/server/http/guard';
import { createGame, gamesOf } from '$lib/server/games';
import { findTeam } from '$lib/server/teams';
import { db } from '$lib/server/runtime';
import { importBundle } from '$lib/server/game-io';
import { BundleError, MAX_BUNDLE_UNCOMPRESSED_BYTES } from '$lib/game/bundle';
import { Refusal } from '$lib/server/refusals';

export const load = async ({ locals, params }) => {
	const d = await db();
	const { role } = await requireRole(d, locals, params.teamId, 'team.read');
	const team = (await findTeam(d, params.teamId))!;
	const games = await gamesOf(d, params.teamId);
	return {
		team: { id: team.id, name: team.name },
		role,
		mayCreate: may(role, 'game.create'),
		games: games.map((g) => ({ id: g.id, name: g.name, slug: g.slug, updatedAt: g.updatedAt })),
		form: await superValidate(zod4(gameCreateSchema))
	};
};

export const actions = {
	createGame: async ({ request, locals, params }) => {
		const d = await db();
		const { actor } = await requireRole(d, locals, params.teamId, 'game.create');
		const form = await superValidate(request, zod4(gameCreateSchema));
		if (!form.valid) return fail(400, { form });
		const game = await createGame(d, actor, form.data);
		redirect(303, `/games/${game.id}`);
	},
	importGame: async ({ request, locals, params }) => {
		const d = await db();
		const { actor } = await requireRole(d, locals, params.teamId, 'game.create');
		const declared = Number(request.headers.get('content-length') ?? 0);
		if (declared > MAX_BUNDLE_UNCOMPRESSED_BYTES) return fail(413, { importError: 'The bundle is too large.' });
		const file = (await request.formData()).get('bundle');
		if (!(file instanceof File) || file.size === 0) return fail(400, { importError: 'Choose a game bundle (.zip) to import.' });
		let gameId: string;
		try {
			gameId = (await importBundle(d, actor, { zip: new Uint8Array(await file.arrayBuffer()) })).id;
		} catch (e) {
			if (e instanceof BundleError || e instanceof Refusal) return fail(400, { importError: `Nothing was imported: ${e.message}` });
			throw e;
		}
		redirect(303, `/games/${gameId}`);
	}
};
