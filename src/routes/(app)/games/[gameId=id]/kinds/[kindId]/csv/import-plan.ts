/**
 * A CSV import of one kind, planned before anything is written: the file is read with the same
 * schemas as the forms (src/lib/game/csv.ts), compared with the kind's cards by name, and turned
 * into the writes that apply it. A file with any error plans no writes at all.
 */
import { diffCards, importCardsCsv, type CsvError } from '$lib/game/csv';
import { newId, type Card, type CardKind, type Game, type Id } from '$lib/game/model';
import { cardSummary, type RowContext } from '$lib/game/card-rows';
import type { CardWrite } from '$lib/game/generator';

export interface PlannedCard {
	name: string;
	copies: number;
	summary: string;
	/** Line of the file the card comes from (absent for removed cards). */
	line?: number;
}

export interface ChangedCard extends PlannedCard {
	fields: string[];
	before: string;
	beforeCopies: number;
}

export interface ImportPreview {
	ok: boolean;
	errors: CsvError[];
	added: PlannedCard[];
	changed: ChangedCard[];
	/** Cards of the kind the file does not list: removed, or kept when `removeMissing` is off. */
	missing: PlannedCard[];
	removeMissing: boolean;
	unchanged: number;
	/** Data rows the file holds. */
	rows: number;
}

export function planImport(
	game: Game,
	kind: CardKind,
	text: string,
	removeMissing: boolean,
	makeId: () => Id = newId
): { preview: ImportPreview; writes: CardWrite[] } {
	const ctx: RowContext = { runners: game.runners, rogue: game.rogueRunner, moneyTables: game.moneyTables };
	const parsed = importCardsCsv(text, kind, { runners: game.runners, moneyTables: game.moneyTables });
	const empty: ImportPreview = { ok: false, errors: parsed.errors, added: [], changed: [], missing: [], removeMissing, unchanged: 0, rows: 0 };
	if (!parsed.ok) return { preview: empty, writes: [] };

	const diff = diffCards(game.cards, parsed.rows, kind.id, makeId);
	const lineOf = new Map(parsed.rows.map((r) => [r.name, r.line]));
	const describe = (c: Card): PlannedCard => ({ name: c.name, copies: c.copies, summary: cardSummary(c, kind, ctx), line: lineOf.get(c.name) });
	const writes: CardWrite[] = [
		...diff.added.map((c): CardWrite => ({ id: c.id, baseVersion: null, object: c })),
		...diff.changed.map((ch): CardWrite => ({ id: ch.after.id, baseVersion: ch.before.version ?? 0, object: ch.after })),
		...(removeMissing ? diff.removed.map((c): CardWrite => ({ id: c.id, baseVersion: c.version ?? 0, remove: true })) : [])
	];
	return {
		preview: {
			ok: true,
			errors: [],
			added: diff.added.map(describe),
			changed: diff.changed.map((ch) => ({
				...describe(ch.after),
				fields: ch.fields,
				before: cardSummary(ch.before, kind, ctx),
				beforeCopies: ch.before.copies
			})),
			missing: diff.removed.map((c) => ({ ...describe(c), line: undefined })),
			removeMissing,
			unchanged: diff.unchanged.length,
			rows: parsed.rows.length
		},
		writes
	};
}

/**
 * What the preview was made against: the kind and its cards (with versions), and the names the
 * file is read by. Confirming a preview made against anything else asks for a fresh look first.
 */
export function importBasis(game: Game, kind: CardKind): string {
	return JSON.stringify([
		kind.id,
		kind.version,
		game.cards.filter((c) => c.kindId === kind.id).map((c) => `${c.id}@${c.version}`),
		game.runners.map((r) => `${r.id}=${r.name}`),
		game.moneyTables.map((t) => `${t.id}=${t.name}`)
	]);
}
