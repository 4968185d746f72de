import { error, fail, redirect } from '@sveltejs/kit';
import { requireGameRole, may } from '$lib/server/http/guard';
import { editPermission } from '$lib/server/http/game-access';
import { historyOf, currentOf, versionOf, restoreVersion } from '$lib/server/history';
import { answerFor } from '$lib/server/http/answers';
import { COLLECTION_SEGMENTS } from '$lib/schemas/collections';
import type { HistoryCollection } from '$lib/server/history';
import { fieldChanges, flattenFields, objectLabel } from '$lib/game/history';
import { isUuid } from '$lib/schemas/ids';
import { db } from '$lib/server/runtime';

const COLLECTIONS: HistoryCollection[] = [...Object.values(COLLECTION_SEGMENTS), 'settings'];

/** "card:<id>" from ?object=, or null. */
function objectParam(value: string | null): { collection: HistoryCollection; id: string } | null {
	if (!value) return null;
	const at = value.indexOf(':');
	const collection = value.slice(0, at) as HistoryCollection;
	const id = value.slice(at + 1);
	if (at < 1 || !COLLECTIONS.includes(collection) || !id || id.length > 100) error(404, 'No such object in this game');
	return { collection, id };
}

/**
 * The game's recent changes; with ?object=<collection>:<id>, that object's versions, one of them
 * (?v=) shown field by field against the object as it is now, with a button to restore it.
 */
export const load = async ({ locals, params, url }) => {
	const d = await db();
	const { role } = await requireGameRole(d, locals, params.gameId, 'game.read');
	const object = objectParam(url.searchParams.get('object'));
	if (!object) return { object: null, entries: await historyOf(d, params.gameId, { limit: 150 }) };
	const entries = await historyOf(d, params.gameId, { collection: object.collection, objectId: object.id, limit: 500 });
	if (entries.length === 0) error(404, 'No such object in this game');
	const current = await currentOf(d, params.gameId, object.collection, object.id);
	const v = url.searchParams.get('v');
	let viewed = null;
	if (v) {
		if (!isUuid(v)) error(404, 'No such version');
		const row = await versionOf(d, params.gameId, v).catch(() => error(404, 'No such version'));
		if (row.collection !== object.collection || row.objectId !== object.id) error(404, 'No such version');
		viewed = {
			id: row.id,
			version: row.version,
			action: row.action,
			fields: [...flattenFields(row.data)].map(([field, value]) => ({ field, value })),
			againstNow: current ? fieldChanges(row.data, current) : null
		};
	}
	return {
		object: {
			...object,
			label: object.collection === 'settings' ? entries[0].label : current ? objectLabel(current, object.id) : entries[0].label,
			currentVersion: current?.version ?? null,
			kindId: object.collection === 'card' && current ? String(current.kindId ?? '') : null
		},
		entries,
		viewed,
		mayRestore: may(role, editPermission(object.collection)),
		restored: url.searchParams.get('restored')
	};
};

export const actions = {
	restore: async ({ locals, params, request }) => {
		const d = await db();
		await requireGameRole(d, locals, params.gameId, 'game.read');
		const form = await request.formData();
		const versionId = String(form.get('versionId') ?? '');
		const seen = String(form.get('version') ?? '');
		if (!isUuid(versionId) || (seen !== '' && !/^\d{1,9}$/.test(seen))) return fail(400, { message: 'Say which version to restore.' });
		let row;
		try {
			row = await versionOf(d, params.gameId, versionId);
		} catch (e) {
			const refused = answerFor(e);
			if (refused) return fail(refused.status, { message: refused.message });
			throw e;
		}
		const { actor } = await requireGameRole(d, locals, params.gameId, editPermission(row.collection));
		let restored;
		try {
			restored = await restoreVersion(d, actor, { versionId, version: seen === '' ? null : Number(seen) });
		} catch (e) {
			const refused = answerFor(e);
			if (refused) {
				const message =
					refused.status === 409
						? 'It changed after you opened this page. Nothing was restored: look at the newest version, then restore again if you still want to.'
						: refused.message;
				return fail(refused.status, { message });
			}
			throw e;
		}
		redirect(303, `/games/${actor.gameId}/history?object=${row.collection}:${encodeURIComponent(row.objectId)}&restored=${restored.restoredFrom}`);
	}
};
