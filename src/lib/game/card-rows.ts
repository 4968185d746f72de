/**
 * A kind's cards as table rows: the columns its type shows, each card's cells (runners and
 * money tables by name), sorting by a column and a text filter. Plain data in and out, so the
 * browser table and the server's import preview read the cards the same way.
 */
import { type Card, type CardKind, type MoneyTable, type RogueRunner, type Runner, type RunnerLook } from './model';
import { BET_LABEL, TILE_ROLE_LABEL } from './labels';

export interface Column {
	key: string;
	label: string;
	numeric: boolean;
}

export type Cell = string | number;

export interface CardRow {
	id: string;
	name: string;
	copies: number;
	cells: Record<string, Cell>;
	/** The runner the card belongs to, for its badge. */
	runner?: Pick<Runner, 'colourHex' | 'symbol' | 'name'>;
	/** Every cell in lower case, for the filter. */
	search: string;
}

export interface RowContext {
	runners: readonly RunnerLook[];
	rogue?: Pick<RogueRunner, 'name'> | null;
	moneyTables: readonly Pick<MoneyTable, 'id' | 'name' | 'rows' | 'otherCoins'>[];
}

const col = (key: string, label: string, numeric = false): Column => ({ key, label, numeric });

/** The data columns of a kind, after name and copies. */
export function cardColumns(kind: Pick<CardKind, 'type' | 'fields'>): Column[] {
	const data: Column[] = (() => {
		switch (kind.type) {
			case 'movement':
				return [col('runner', 'Runner'), col('steps', 'Steps', true)];
			case 'rogue':
				return [col('steps', 'Steps back', true)];
			case 'wager':
				return [col('betType', 'Bet'), col('runner', 'Runner'), col('tier', 'Tier', true), col('moneyTable', 'Money table'), col('pays', 'Pays')];
			case 'setup':
				return [
					col('players', 'Players', true),
					col('handSize', 'Hand', true),
					col('discards', 'Put aside', true),
					col('toSharedDeck', 'To shared deck', true),
					col('faceUp', 'Face up', true),
					col('extraFromDeck', 'Extra', true),
					col('trackLength', 'Track tiles', true),
					col('rogueToDeck', 'Rogue to deck', true)
				];
			case 'modifier':
				return [col('modifierName', 'Token'), col('steps', 'Steps', true), col('effectText', 'Effect')];
			case 'custom':
				return kind.fields.map((f) => col(`field:${f}`, f));
			case 'tile':
				return [
					col('number', 'No.', true),
					col('role', 'Role'),
					col('spacesFront', 'Spaces front', true),
					col('spacesBack', 'Spaces back', true),
					col('backLabel', 'Reverse side')
				];
		}
	})();
	return [col('name', 'Name'), col('copies', 'Copies', true), ...data];
}

const signed = (n: number) => (n > 0 ? `+${n}` : n < 0 ? `−${-n}` : '0');

/** A money table in one line: “1: +5 · 2: +1 · others −1”. */
export function payoutLine(table: Pick<MoneyTable, 'rows' | 'otherCoins'>): string {
	const parts = [...table.rows].sort((a, b) => a.place - b.place).map((r) => `${r.place}: ${signed(r.coins)}`);
	if (table.otherCoins !== undefined) parts.push(`others ${signed(table.otherCoins)}`);
	return parts.join(' · ');
}

export function cardRow(card: Card, ctx: RowContext): CardRow {
	const runner = (id: string) => ctx.runners.find((r) => r.id === id);
	const cells: Record<string, Cell> = { name: card.name, copies: card.copies };
	let who: CardRow['runner'];
	const d = card.data;
	switch (d.type) {
		case 'movement': {
			const r = runner(d.runnerId);
			who = r;
			Object.assign(cells, { runner: r?.name ?? d.runnerId, steps: d.steps });
			break;
		}
		case 'rogue':
			Object.assign(cells, { steps: d.steps });
			break;
		case 'wager': {
			const r = runner(d.runnerId);
			const table = ctx.moneyTables.find((t) => t.id === d.moneyTableId);
			who = r;
			Object.assign(cells, {
				betType: BET_LABEL[d.betType],
				runner: r?.name ?? d.runnerId,
				tier: d.tier,
				moneyTable: table?.name ?? d.moneyTableId,
				pays: table ? payoutLine(table) : ''
			});
			break;
		}
		case 'setup': {
			const { type: _type, ...counts } = d;
			Object.assign(cells, counts);
			break;
		}
		case 'modifier':
			Object.assign(cells, { modifierName: d.name, steps: d.steps, effectText: d.effectText });
			break;
		case 'custom':
			for (const [k, v] of Object.entries(d.values)) cells[`field:${k}`] = v;
			break;
		case 'tile':
			Object.assign(cells, {
				number: d.number,
				role: TILE_ROLE_LABEL[d.role],
				spacesFront: d.spacesFront,
				spacesBack: d.spacesBack,
				backLabel: d.backLabel
			});
			break;
	}
	return {
		id: card.id,
		name: card.name,
		copies: card.copies,
		cells,
		runner: who,
		search: Object.values(cells).join(' ').toLowerCase()
	};
}

/** One line for a card in lists such as the import preview: its data cells after name and copies. */
export function cardSummary(card: Card, kind: Pick<CardKind, 'type' | 'fields'>, ctx: RowContext): string {
	const row = cardRow(card, ctx);
	return cardColumns(kind)
		.slice(2)
		.filter((c) => c.key !== 'pays')
		.map((c) => `${c.label} ${row.cells[c.key] ?? '—'}`)
		.join(' · ');
}

export type SortDirection = 'ascending' | 'descending';

const collator = new Intl.Collator(undefined, { numeric: true, sensitivity: 'base' });

/** Sorted by one column; ties keep their order (Array.prototype.sort is stable, ES2019). */
export function sortRows(rows: readonly CardRow[], key: string | null, direction: SortDirection): CardRow[] {
	if (!key) return [...rows];
	const sign = direction === 'ascending' ? 1 : -1;
	return [...rows].sort((a, b) => {
		const x = a.cells[key];
		const y = b.cells[key];
		if (x === undefined || y === undefined) return x === y ? 0 : x === undefined ? 1 : -1;
		const order = typeof x === 'number' && typeof y === 'number' ? x - y : collator.compare(String(x), String(y));
		return sign * order;
	});
}

/** Rows holding every word of the filter somewhere in their cells. */
export function filterRows(rows: readonly CardRow[], text: string): CardRow[] {
	const words = text.toLowerCase().split(/\s+/).filter(Boolean);
	if (words.length === 0) return [...rows];
	return rows.filter((r) => words.every((w) => r.search.includes(w)));
}
