import { error, fail, redirect, type RequestEvent } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireGame, requireGameRole } from '$lib/server/http/guard';
import { applyChanges, loadGame, type Change } from '$lib/server/game-store';
import { saveObjectAction, deleteObjectAction } from '$lib/server/http/object-actions';
import { db } from '$lib/server/runtime';
import { CardKindSchema, CardSchema, type Card, type Game } from '$lib/game/model';
import { blankCard } from '$lib/game/kind-defaults';
import {
	currentRun,
	isGenerated,
	planRun,
	runCards,
	RUN_SCHEMAS
} from '$lib/game/generator';
import { answerFor } from '$lib/server/http/answers';
import type { LayoutGame } from '$lib/print/layout';

const VIEWS = ['cards', 'settings', 'generate'] as const;
type View = (typeof VIEWS)[number];

function kindOf(game: Game, kindId: string) {
	const kind = game.kinds.find((k) => k.id === kindId);
	if (!kind) error(404, 'No such card kind');
	return kind;
}

/** The kind, its cards, the editors' forms and what the forms pick from (runners, tables, art). */
export const load = async ({ locals, params, url }) => {
	const d = await db();
	const { doc: game } = await requireGame(d, locals, params.gameId, 'game.read');
	const kind = kindOf(game, params.kindId);
	const cards = game.cards.filter((c) => c.kindId === kind.id);
	const asked = url.searchParams.get('view');
	const view: View = (VIEWS as readonly string[]).includes(asked ?? '') ? (asked as View) : 'cards';

	const wanted = url.searchParams.get('card');
	const chosen = cards.find((c) => c.id === wanted);
	const isNew = !chosen && (wanted === 'new' || cards.length === 0);
	const editing: Card = chosen ?? (isNew ? blankCard(kind, game) : cards[0]);

	// Each generator form sits at the top of the data, where superforms finds it after a reload.
	const run = currentRun(kind, game);
	const movementRun = run?.type === 'movement' ? await superValidate(run, zod4(RUN_SCHEMAS.movement), { id: 'generate', errors: false }) : null;
	const rogueRun = run?.type === 'rogue' ? await superValidate(run, zod4(RUN_SCHEMAS.rogue), { id: 'generate', errors: false }) : null;
	const wagerRun = run?.type === 'wager' ? await superValidate(run, zod4(RUN_SCHEMAS.wager), { id: 'generate', errors: false }) : null;
	const tileRun = run?.type === 'tile' ? await superValidate(run, zod4(RUN_SCHEMAS.tile), { id: 'generate', errors: false }) : null;

	return {
		view,
		kind,
		cards,
		isNewCard: isNew,
		runners: game.runners,
		rogue: game.rogueRunner ?? null,
		moneyTables: game.moneyTables,
		/** What the live preview lays a face out against, in the browser. */
		layoutGame: { name: game.name, runners: game.runners, rogueRunner: game.rogueRunner, moneyTables: game.moneyTables, art: game.art } satisfies LayoutGame,
		/** Art placed in the kind's slots (kind-wide), by slot. */
		slotArt: Object.fromEntries(
			kind.artSlots.map((slot) => [
				slot,
				game.art.filter((a) => a.assignment?.scope === 'kind' && a.assignment.targetId === kind.id && a.assignment.slot === slot).map((a) => a.fileName)
			])
		) as Record<string, string[]>,
		kindForm: await superValidate(kind, zod4(CardKindSchema), { id: 'kind', errors: false }),
		cardForm: await superValidate(editing, zod4(CardSchema), { id: 'card', errors: false }),
		movementRun,
		rogueRun,
		wagerRun,
		tileRun
	};
};

async function editor(event: RequestEvent<{ gameId: string; kindId: string }>) {
	const d = await db();
	const { game: row, actor } = await requireGameRole(d, event.locals, event.params.gameId, 'game.edit');
	const game = await loadGame(d, row.id);
	return { d, actor, row, game, kind: kindOf(game, event.params.kindId) };
}

export const actions = {
	saveKind: (event) => saveObjectAction(event, 'kind'),
	/** The kind and all its cards in one write: a kind never leaves cards behind. */
	deleteKind: async (event) => {
		const { d, actor, row, game, kind } = await editor(event);
		const body = await event.request.formData();
		const version = Number(body.get('version'));
		if (!Number.isInteger(version)) return fail(400, { deleteError: 'Say which version of the kind to delete' });
		if (body.get('confirm') !== 'yes') return fail(400, { deleteError: 'Tick the box to confirm that the cards go too' });
		const changes: Change[] = [
			...game.cards.filter((c) => c.kindId === kind.id).map((c): Change => ({ collection: 'card', id: c.id, baseVersion: c.version ?? 0, remove: true })),
			{ collection: 'kind', id: kind.id, baseVersion: version, remove: true }
		];
		try {
			await applyChanges(d, actor, { changes, action: 'kind.deleted' });
		} catch (e) {
			const refused = answerFor(e);
			if (refused) return fail(refused.status, { deleteError: refused.message });
			throw e;
		}
		redirect(303, `/games/${row.id}/kinds`);
	},
	saveCard: (event) => saveObjectAction(event, 'card'),
	deleteCard: (event) => deleteObjectAction(event, 'card'),
	/** Makes the kind's cards from a matrix and writes them all in one go. */
	generate: async (event) => {
		const { d, actor, row, game, kind } = await editor(event);
		if (!isGenerated(kind.type)) return fail(400, { generateError: `${kind.type} cards have no generator; add them one by one or import a CSV` });
		const form = await superValidate(event.request, zod4(RUN_SCHEMAS[kind.type]));
		if (!form.valid) return fail(400, { form });
		let made: Card[];
		try {
			made = runCards(kind, game, form.data);
		} catch (e) {
			return message(form, (e as Error).message, { status: 400 });
		}
		const plan = planRun(game.cards, kind.id, made, form.data.replace);
		if (plan.writes.length === 0) return message(form, `Nothing to change: the kind already holds these ${plan.unchanged} cards.`);
		try {
			await applyChanges(d, actor, {
				changes: plan.writes.map((w): Change => ({ collection: 'card', id: w.id, baseVersion: w.baseVersion, object: w.object, remove: w.remove })),
				action: 'cards.generated'
			});
		} catch (e) {
			const refused = answerFor(e);
			if (refused) return message(form, `Nothing was changed: ${refused.message}`, { status: refused.status });
			throw e;
		}
		return message(
			form,
			`Made ${made.length} cards: ${plan.added} new, ${plan.updated} changed, ${plan.unchanged} unchanged, ${plan.removed} removed.`
		);
	}
};
