import { fail, redirect } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireGame, requireGameRole } from '$lib/server/http/guard';
import { applyChanges } from '$lib/server/game-store';
import { db } from '$lib/server/runtime';
import { cardCount } from '$lib/game/deck-check';
import { bleedMm, newId } from '$lib/game/model';
import { newKind } from '$lib/game/kind-defaults';
import { NewKindSchema, type NewKind } from '$lib/schemas/kinds';
import { answerFor } from '$lib/server/http/answers';

/** The game's card kinds with their sizes and card counts, and the new-kind form. */
export const load = async ({ locals, params }) => {
	const d = await db();
	const { doc: game } = await requireGame(d, locals, params.gameId, 'game.read');
	const kinds = game.kinds.map((k) => {
		const cards = game.cards.filter((c) => c.kindId === k.id);
		return {
			id: k.id,
			name: k.name,
			type: k.type,
			size: k.size,
			bleed: k.bleed,
			bleedMm: bleedMm(k.bleed),
			template: k.template,
			backMode: k.back.mode,
			designs: cards.length,
			cards: cardCount(cards)
		};
	});
	const blank: NewKind = {
		name: '',
		type: 'movement',
		size: game.defaultSize,
		bleed: game.bleedStandard,
		template: 'movement'
	};
	return {
		kinds,
		totals: { designs: game.cards.length, cards: cardCount(game.cards) },
		form: await superValidate(blank, zod4(NewKindSchema), { errors: false })
	};
};

export const actions = {
	/** Makes the kind with the layouts' defaults and opens it. */
	create: async (event) => {
		const d = await db();
		const { actor } = await requireGameRole(d, event.locals, event.params.gameId, 'game.edit');
		const form = await superValidate(event.request, zod4(NewKindSchema));
		if (!form.valid) return fail(400, { form });
		const kind = newKind(form.data, newId());
		try {
			await applyChanges(d, actor, { changes: [{ collection: 'kind', id: kind.id, baseVersion: null, object: kind }], action: 'kind.created' });
		} catch (e) {
			const refused = answerFor(e);
			if (refused) return message(form, refused.message, { status: refused.status });
			throw e;
		}
		redirect(303, `/games/${actor.gameId}/kinds/${kind.id}`);
	}
};
