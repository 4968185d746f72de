import { error, fail, type RequestEvent } from '@sveltejs/kit';
import { createHash } from 'node:crypto';
import { requireGame, requireGameRole } from '$lib/server/http/guard';
import { applyChanges, loadGame, type Change } from '$lib/server/game-store';
import { db } from '$lib/server/runtime';
import { csvColumns } from '$lib/game/csv';
import type { Game } from '$lib/game/model';
import { importBasis, planImport } from './import-plan';
import { answerFor } from '$lib/server/http/answers';

const removals = (n: number) => `${n} ${n === 1 ? 'card' : 'cards'}`;

/** Largest CSV accepted: far more rows than any kind holds, small enough to parse at once. */
const CSV_LIMIT_CHARS = 1_000_000;

function kindOf(game: Game, kindId: string) {
	const kind = game.kinds.find((k) => k.id === kindId);
	if (!kind) error(404, 'No such card kind');
	return kind;
}

const basisHash = (game: Game, kindId: string) =>
	createHash('sha256').update(importBasis(game, kindOf(game, kindId))).digest('hex');

export const load = async ({ locals, params }) => {
	const d = await db();
	const { doc: game } = await requireGame(d, locals, params.gameId, 'game.read');
	const kind = kindOf(game, params.kindId);
	const cards = game.cards.filter((c) => c.kindId === kind.id);
	return {
		kind: { id: kind.id, name: kind.name, type: kind.type, size: kind.size, bleed: kind.bleed },
		columns: csvColumns(kind),
		designs: cards.length,
		printed: cards.reduce((n, c) => n + c.copies, 0),
		runnerNames: game.runners.map((r) => r.name)
	};
};

/** The CSV text from the form: a chosen file wins over pasted text. */
async function readCsv(body: FormData): Promise<{ text: string } | { problem: string }> {
	const file = body.get('file');
	let text = String(body.get('csv') ?? '');
	if (file instanceof File && file.size > 0) {
		if (file.size > CSV_LIMIT_CHARS * 4) return { problem: 'The file is larger than 4 MB' };
		text = await file.text();
	}
	if (text.length > CSV_LIMIT_CHARS) return { problem: `The CSV is longer than ${CSV_LIMIT_CHARS.toLocaleString('en')} characters` };
	if (!text.trim()) return { problem: 'Paste the CSV text or choose a file first' };
	return { text };
}

async function importer(event: RequestEvent<{ gameId: string; kindId: string }>) {
	const d = await db();
	const { game: row, actor } = await requireGameRole(d, event.locals, event.params.gameId, 'game.edit');
	const body = await event.request.formData();
	return { d, actor, row, body, removeMissing: body.get('removeMissing') === 'on' };
}

export const actions = {
	/** Reads the file and shows what it would change. Writes nothing. */
	preview: async (event) => {
		const { d, row, body, removeMissing } = await importer(event);
		const read = await readCsv(body);
		if ('problem' in read) return fail(400, { csv: String(body.get('csv') ?? ''), removeMissing, problem: read.problem });
		const game = await loadGame(d, row.id);
		const { preview } = planImport(game, kindOf(game, event.params.kindId), read.text, removeMissing);
		if (!preview.ok) return fail(400, { csv: read.text, removeMissing, preview });
		return { csv: read.text, removeMissing, preview, basis: basisHash(game, event.params.kindId) };
	},
	/**
	 * Applies the file: the text is sent again and read again here (the preview step's results are
	 * never trusted), then every change goes in one applyChanges call, so a refusal anywhere means
	 * nothing is imported.
	 */
	apply: async (event) => {
		const { d, actor, row, body, removeMissing } = await importer(event);
		const read = await readCsv(body);
		if ('problem' in read) return fail(400, { csv: '', removeMissing, problem: read.problem });
		const game = await loadGame(d, row.id);
		const kind = kindOf(game, event.params.kindId);
		const { preview, writes } = planImport(game, kind, read.text, removeMissing);
		const basis = basisHash(game, kind.id);
		const again = { csv: read.text, removeMissing, preview, basis };
		if (!preview.ok) return fail(400, { ...again, problem: 'Nothing was imported: the file has errors.' });
		if (String(body.get('basis') ?? '') !== basis)
			return fail(409, { ...again, problem: 'The cards changed since your preview. Nothing was imported; check this new preview and confirm again.' });
		// Removing cards needs the count the person saw and agreed to.
		if (removeMissing && preview.missing.length > 0 && Number(body.get('confirmRemove')) !== preview.missing.length)
			return fail(400, {
				...again,
				problem: `Nothing was imported: this would remove ${removals(preview.missing.length)}. Look at the list below and confirm the import again.`
			});
		if (writes.length === 0) return { applied: { added: 0, changed: 0, removed: 0 } };
		try {
			await applyChanges(d, actor, {
				changes: writes.map((w): Change => ({ collection: 'card', id: w.id, baseVersion: w.baseVersion, object: w.object, remove: w.remove })),
				action: 'cards.imported'
			});
		} catch (e) {
			const refused = answerFor(e);
			if (refused) return fail(refused.status, { ...again, problem: `Nothing was imported: ${refused.message}` });
			throw e;
		}
		return {
			applied: {
				added: preview.added.length,
				changed: preview.changed.length,
				removed: removeMissing ? preview.missing.length : 0
			}
		};
	}
};
