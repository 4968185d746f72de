/**
 * Form actions that save or delete one game object (runner, money table, card kind, card, art):
 * the same zod schema validates the form as the API, the version the form was opened at guards
 * against lost updates, and every refusal comes back as a message on the form.
 */
import { fail, type RequestEvent } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { keepSavedGame, requireGameRole } from './guard';
import { applyChanges, COLLECTION_FIELD, loadGame, OBJECT_SCHEMAS } from '../game-store';
import { formSchema } from '$lib/schemas/known-keys';
import { editPermission } from './game-access';
import type { Collection } from '$lib/schemas/collections';
import { db } from '../runtime';
import { objectPath, usersOf, type ReadinessItem } from '$lib/game/readiness';
import type { FormNote } from '$lib/schemas/messages';
import { answerFor } from './answers';

/** "Saved.", or "Saved, but …" with a link to each object that now needs a look. */
export function savedNote(gameId: string, warnings: ReadinessItem[], what = 'Saved.'): FormNote {
	if (!warnings.length) return { text: what, tone: 'success' };
	return {
		text: `${what} Other parts of the game need a look now:`,
		tone: 'warning',
		links: warnings.map((w) => ({ href: w.ref ? objectPath(gameId, w.ref) : `/games/${gameId}`, label: w.message }))
	};
}

/**
 * Saves one object from its editor's form. The answer carries what the page shows of it: the form
 * holds the object as saved (with its new version, so the next save is checked against it) and
 * `saved` the same object for the page's lists, so the browser needs no reload after a save.
 */
export async function saveObjectAction(event: RequestEvent<{ gameId: string }>, collection: Collection) {
	const d = await db();
	const access = await requireGameRole(d, event.locals, event.params.gameId, editPermission(collection));
	const { actor } = access;
	const form = await superValidate(event.request, zod4(formSchema(OBJECT_SCHEMAS[collection])));
	if (!form.valid) return fail(400, { form });
	const { version, ...object } = form.data as { id: string; version?: number };
	let saved;
	try {
		saved = await applyChanges(d, actor, {
			changes: [{ collection, id: object.id, baseVersion: version ?? null, object }],
			action: `${collection}.saved`
		});
	} catch (e) {
		const refused = answerFor(e);
		if (refused) return message(form, { text: refused.message, tone: 'error' } satisfies FormNote, { status: refused.status });
		throw e;
	}
	const { saveWarnings, ...savedGame } = saved;
	keepSavedGame(event.locals, access, savedGame);
	const written = (savedGame[COLLECTION_FIELD[collection]] as { id: string }[]).find((o) => o.id === object.id)!;
	form.data = written as typeof form.data;
	form.message = savedNote(access.game.id, saveWarnings);
	return { form, saved: written };
}

export async function deleteObjectAction(event: RequestEvent<{ gameId: string }>, collection: Collection) {
	const d = await db();
	const { game, actor } = await requireGameRole(d, event.locals, event.params.gameId, editPermission(collection));
	const body = await event.request.formData();
	const id = String(body.get('id') ?? '');
	const version = Number(body.get('version'));
	if (!id || !Number.isInteger(version)) return fail(400, { deleteError: 'Say what to delete and its version' });
	if (collection === 'runner' || collection === 'moneyTable') {
		const users = usersOf(await loadGame(d, game.id), { collection, id });
		if (users.length)
			return fail(409, { deleteError: `This ${collection === 'runner' ? 'runner' : 'table'} is used by ${users.join('; ')}. Change or delete those first.` });
	}
	try {
		await applyChanges(d, actor, { changes: [{ collection, id, baseVersion: version, remove: true }], action: `${collection}.deleted` });
	} catch (e) {
		const refused = answerFor(e);
		if (refused) return fail(refused.status, { deleteError: refused.message });
		throw e;
	}
	return { deleted: id };
}
