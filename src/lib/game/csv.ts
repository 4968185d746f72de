/**
 * CSV import and export of one card kind's data rows.
 *
 * Columns: `name`, `copies`, then the data fields of the kind's type; runners and money tables
 * are written by name, so a designer can edit the file in any spreadsheet. Import validates
 * every row with the same zod schemas as the forms and, if anything is wrong, returns no rows at
 * all: a file either applies completely or not at all.
 */
import Papa from 'papaparse';
import {
	CARD_DATA_SCHEMAS,
	CardSchema,
	newId,
	type Card,
	type CardData,
	type CardKind,
	type CardKindType,
	type Id,
	type MoneyTable,
	type Runner
} from './model';

export interface CsvContext {
	runners: readonly Runner[];
	moneyTables: readonly MoneyTable[];
}

export interface CsvRow {
	/** Line of the file where the row starts (the header is line 1). */
	line: number;
	name: string;
	copies: number;
	data: CardData;
}

export interface CsvError {
	/** 1-based line, counting the header as line 1. */
	line: number;
	column?: string;
	message: string;
}

export interface CsvImport {
	/** Empty whenever `errors` is not: nothing of a bad file is ever applied. */
	rows: CsvRow[];
	errors: CsvError[];
	ok: boolean;
}

/** Data columns per kind type, in file order (custom kinds add their own fields). */
const DATA_COLUMNS: Record<Exclude<CardKindType, 'custom'>, readonly string[]> = {
	movement: ['runner', 'steps'],
	rogue: ['steps'],
	wager: ['betType', 'runner', 'tier', 'moneyTable'],
	setup: ['players', 'handSize', 'discards', 'toSharedDeck', 'faceUp', 'extraFromDeck', 'trackLength', 'rogueToDeck'],
	modifier: ['modifierName', 'effectText', 'steps'],
	tile: ['number', 'role', 'spacesFront', 'spacesBack', 'backLabel']
};

/** Columns whose cells may be left empty. */
const OPTIONAL_TEXT = new Set(['effectText', 'backLabel']);
/** Columns added after files were already in use: a file may leave them out (or a cell empty). */
const OPTIONAL_COLUMNS = new Set(['rogueToDeck']);

export function csvColumns(kind: Pick<CardKind, 'type' | 'fields'>): string[] {
	const data = kind.type === 'custom' ? kind.fields : DATA_COLUMNS[kind.type];
	return ['name', 'copies', ...data];
}

/* ------------------------------------------------------------------ export */

function rowOf(card: Card, ctx: CsvContext): Record<string, string | number> {
	const runnerName = (id: Id) => ctx.runners.find((r) => r.id === id)?.name ?? id;
	const tableName = (id: Id) => ctx.moneyTables.find((t) => t.id === id)?.name ?? id;
	const d = card.data;
	const base = { name: card.name, copies: card.copies };
	switch (d.type) {
		case 'movement':
			return { ...base, runner: runnerName(d.runnerId), steps: d.steps };
		case 'rogue':
			return { ...base, steps: d.steps };
		case 'wager':
			return { ...base, betType: d.betType, runner: runnerName(d.runnerId), tier: d.tier, moneyTable: tableName(d.moneyTableId) };
		case 'setup':
			return {
				...base,
				players: d.players,
				handSize: d.handSize,
				discards: d.discards,
				toSharedDeck: d.toSharedDeck,
				faceUp: d.faceUp,
				extraFromDeck: d.extraFromDeck,
				trackLength: d.trackLength,
				rogueToDeck: d.rogueToDeck ?? ''
			};
		case 'modifier':
			return { ...base, modifierName: d.name, effectText: d.effectText, steps: d.steps };
		case 'tile':
			return { ...base, number: d.number, role: d.role, spacesFront: d.spacesFront, spacesBack: d.spacesBack, backLabel: d.backLabel };
		case 'custom':
			return { ...base, ...d.values };
	}
}

/**
 * The kind's cards as CSV (header line first, CRLF line ends as RFC 4180 asks). Text cells that
 * a spreadsheet would run as a formula get a leading apostrophe; import takes it off again.
 */
export function exportCardsCsv(kind: CardKind, cards: readonly Card[], ctx: CsvContext): string {
	const columns = csvColumns(kind);
	const data = cards
		.filter((c) => c.kindId === kind.id)
		.map((c) => {
			const row = rowOf(c, ctx);
			return columns.map((col) => row[col] ?? '');
		});
	return Papa.unparse({ fields: columns, data }, { newline: '\r\n', escapeFormulae: true });
}

/* ------------------------------------------------------------------ import */

const FORMULA_ESCAPED = /^'[=+\-@\t\r]/;
const NUMBER = /^[+-]?\d+(\.\d+)?$/;

/** Where each parsed row starts, as a 1-based line number. */
function lineCounter(text: string) {
	const lineStarts: number[] = [0];
	for (let i = 0; i < text.length; i++) if (text[i] === '\n') lineStarts.push(i + 1);
	return (offset: number) => {
		// Skip blank lines between rows: a row starts at its first non-blank character.
		let at = offset;
		while (at < text.length && (text[at] === '\n' || text[at] === ' ' || text[at] === '\t')) at++;
		let lo = 0;
		let hi = lineStarts.length - 1;
		while (lo < hi) {
			const mid = (lo + hi + 1) >> 1;
			if (lineStarts[mid] <= at) lo = mid;
			else hi = mid - 1;
		}
		return lo + 1;
	};
}

/** The reader's complaints in words a spreadsheet user can act on (its own wording names its internals). */
function quoteProblem(code: string): string {
	if (code === 'MissingQuotes') return 'A value opens with a quote mark (") that is never closed: close it, or remove it';
	if (code === 'InvalidQuotes') return 'A quoted value has more text after its closing quote mark ("): put the whole value inside the quotes, and write a quote mark inside a value as two ("")';
	return 'This line cannot be read as CSV: check its commas and quote marks';
}

/** Reads a kind's data rows. Any error anywhere means `rows` is empty. */
export function importCardsCsv(text: string, kind: CardKind, ctx: CsvContext): CsvImport {
	const errors: CsvError[] = [];
	const fail = (): CsvImport => ({ rows: [], errors, ok: false });
	const normalised = text.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n');
	const lineAt = lineCounter(normalised);

	const records: { line: number; cells: string[] }[] = [];
	let cursor = 0;
	Papa.parse<string[]>(normalised, {
		newline: '\n',
		skipEmptyLines: 'greedy',
		step: (result) => {
			const line = lineAt(cursor);
			cursor = result.meta.cursor;
			for (const e of result.errors) errors.push({ line, message: quoteProblem(e.code) });
			records.push({ line, cells: result.data });
		}
	});
	if (errors.length > 0) return fail();
	if (records.length === 0) {
		errors.push({ line: 1, message: 'The file is empty: expected a header line' });
		return fail();
	}

	// Header: every expected column exactly once, nothing unknown (a typo must not be dropped silently).
	const expected = csvColumns(kind);
	const header = records[0].cells.map((h) => h.trim());
	const index = new Map<string, number>();
	header.forEach((h, i) => {
		const known = expected.find((c) => c.toLowerCase() === h.toLowerCase());
		if (!known) errors.push({ line: 1, column: h, message: `Unknown column “${h}”; expected ${expected.join(', ')}` });
		else if (index.has(known)) errors.push({ line: 1, column: h, message: `Column “${h}” appears twice` });
		else index.set(known, i);
	});
	for (const c of expected) if (!index.has(c) && !OPTIONAL_COLUMNS.has(c)) errors.push({ line: 1, column: c, message: `Missing column “${c}”` });
	if (errors.length > 0) return fail();
	if (records.length === 1) {
		errors.push({ line: 1, message: 'The file has a header but no data rows' });
		return fail();
	}

	const runnerByName = new Map(ctx.runners.map((r) => [r.name.trim().toLowerCase(), r]));
	const tableByName = new Map(ctx.moneyTables.map((t) => [t.name.trim().toLowerCase(), t]));
	const schema = CARD_DATA_SCHEMAS[kind.type];
	const rows: CsvRow[] = [];
	const namesSeen = new Map<string, number>();

	for (const { line, cells } of records.slice(1)) {
		const rowErrors: CsvError[] = [];
		const err = (column: string | undefined, message: string) => rowErrors.push({ line, column, message });
		if (cells.length !== header.length) {
			err(undefined, `Row has ${cells.length} cells, the header has ${header.length}`);
			errors.push(...rowErrors);
			continue;
		}
		const cell = (col: string) => {
			if (!index.has(col)) return '';
			const raw = cells[index.get(col)!];
			return FORMULA_ESCAPED.test(raw) ? raw.slice(1) : raw;
		};
		const num = (col: string): number | undefined => {
			const v = cell(col).trim();
			if (v === '') {
				err(col, `“${col}” is empty`);
				return undefined;
			}
			if (!NUMBER.test(v)) {
				err(col, `“${v}” is not a number`);
				return undefined;
			}
			return Number(v);
		};
		const text = (col: string): string | undefined => {
			const v = cell(col).trim();
			if (v === '' && !OPTIONAL_TEXT.has(col)) {
				err(col, `“${col}” is empty`);
				return undefined;
			}
			return v;
		};
		const runner = (col: string): Id | undefined => {
			const v = text(col);
			if (v === undefined) return undefined;
			const r = runnerByName.get(v.toLowerCase());
			if (!r) err(col, `No runner is called “${v}” (runners: ${ctx.runners.map((x) => x.name).join(', ')})`);
			return r?.id;
		};
		const table = (col: string): Id | undefined => {
			const v = text(col);
			if (v === undefined) return undefined;
			const t = tableByName.get(v.toLowerCase());
			if (!t) err(col, `No money table is called “${v}”`);
			return t?.id;
		};

		const name = text('name');
		const copies = num('copies');
		let candidate: Record<string, unknown>;
		switch (kind.type) {
			case 'movement':
				candidate = { runnerId: runner('runner'), steps: num('steps') };
				break;
			case 'rogue':
				candidate = { steps: num('steps') };
				break;
			case 'wager':
				candidate = { betType: text('betType'), runnerId: runner('runner'), tier: num('tier'), moneyTableId: table('moneyTable') };
				break;
			case 'setup':
				candidate = Object.fromEntries(
					DATA_COLUMNS.setup.filter((c) => !(OPTIONAL_COLUMNS.has(c) && cell(c).trim() === '')).map((c) => [c, num(c)])
				);
				break;
			case 'modifier':
				candidate = { name: text('modifierName'), effectText: text('effectText'), steps: num('steps') };
				break;
			case 'tile':
				candidate = {
					number: num('number'),
					role: text('role'),
					spacesFront: num('spacesFront'),
					spacesBack: num('spacesBack'),
					backLabel: text('backLabel')
				};
				break;
			case 'custom':
				// An empty cell means the card has no value for that field.
				candidate = {
					values: Object.fromEntries(kind.fields.map((f) => [f, cell(f)]).filter(([, v]) => v.trim() !== ''))
				};
				break;
		}
		if (rowErrors.length > 0) {
			errors.push(...rowErrors);
			continue;
		}

		// The same schemas as the forms: name and copies from the card, the rest from the data type.
		const nameOk = CardSchema.shape.name.safeParse(name);
		if (!nameOk.success) err('name', nameOk.error.issues[0].message);
		const copiesOk = CardSchema.shape.copies.safeParse(copies);
		if (!copiesOk.success) err('copies', copiesOk.error.issues[0].message);
		const parsed = schema.safeParse({ type: kind.type, ...candidate });
		if (!parsed.success)
			for (const issue of parsed.error.issues) err(columnOf(kind.type, issue.path), issue.message);
		if (nameOk.success) {
			const first = namesSeen.get(nameOk.data);
			if (first !== undefined) err('name', `“${nameOk.data}” is already on line ${first}; names must differ`);
			else namesSeen.set(nameOk.data, line);
		}
		if (rowErrors.length > 0 || !parsed.success || !nameOk.success || !copiesOk.success) {
			errors.push(...rowErrors);
			continue;
		}
		rows.push({ line, name: nameOk.data, copies: copiesOk.data, data: parsed.data as CardData });
	}
	if (errors.length > 0) return fail();
	return { rows, errors: [], ok: true };
}

/** The CSV column a schema issue points at. */
function columnOf(type: CardKindType, path: readonly PropertyKey[]): string | undefined {
	const key = String(path[type === 'custom' ? 1 : 0] ?? '');
	const rename: Record<string, string> = { runnerId: 'runner', moneyTableId: 'moneyTable' };
	if (type === 'modifier' && key === 'name') return 'modifierName';
	return rename[key] ?? (key || undefined);
}

/* -------------------------------------------------------------------- diff */

export interface CardChange {
	before: Card;
	/** The card as it would be after import: same id and version, new copies and data. */
	after: Card;
	/** Which fields differ: 'copies' and/or data keys. */
	fields: string[];
}

export interface CardDiff {
	/** New cards, with fresh ids, ready to insert. */
	added: Card[];
	changed: CardChange[];
	/** Cards of the kind that the file no longer lists. */
	removed: Card[];
	unchanged: Card[];
}

/** Key-order independent JSON, so two equal records compare equal. */
function canonical(value: unknown): string {
	if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
	if (value && typeof value === 'object')
		return `{${Object.keys(value)
			.sort()
			.map((k) => `${JSON.stringify(k)}:${canonical((value as Record<string, unknown>)[k])}`)
			.join(',')}}`;
	return JSON.stringify(value);
}

function changedFields(before: Card, row: CsvRow): string[] {
	const fields: string[] = [];
	if (before.copies !== row.copies) fields.push('copies');
	const a = before.data as Record<string, unknown>;
	const b = row.data as Record<string, unknown>;
	for (const key of new Set([...Object.keys(a), ...Object.keys(b)]))
		if (canonical(a[key]) !== canonical(b[key])) fields.push(key);
	return fields;
}

/**
 * Preview of an import against the kind's current cards, matched by name (exact).
 * `existing` may hold other kinds' cards; only `kindId`'s are compared.
 */
export function diffCards(
	existing: readonly Card[],
	incoming: readonly CsvRow[],
	kindId: Id,
	makeId: () => Id = newId
): CardDiff {
	const current = existing.filter((c) => c.kindId === kindId);
	const byName = new Map(current.map((c) => [c.name, c]));
	const seen = new Set<string>();
	const diff: CardDiff = { added: [], changed: [], removed: [], unchanged: [] };
	for (const row of incoming) {
		seen.add(row.name);
		const before = byName.get(row.name);
		if (!before) {
			diff.added.push({ id: makeId(), kindId, name: row.name, data: row.data, copies: row.copies });
			continue;
		}
		const fields = changedFields(before, row);
		if (fields.length === 0) diff.unchanged.push(before);
		else diff.changed.push({ before, after: { ...before, copies: row.copies, data: row.data }, fields });
	}
	for (const c of current) if (!seen.has(c.name)) diff.removed.push(c);
	return diff;
}
