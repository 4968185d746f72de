/**
 * Wager card front: the runner band with the tier badge (earlier takers win more), the bet in
 * words, and the money table the card pays: each finishing place with the coins won or lost.
 */
import type { MoneyTable, WagerData } from '../../game/model';
import { MM_PER_PT } from '../text';
import type { FaceContext } from './context';
import { drawSlot, slotArt } from './context';
import { legibleOn } from './contrast';
import { hex, type Box } from './face-builder';
import { drawBand, drawFrame, drawGround, runnerColour, type FrontParams } from './frame';
import { UNKNOWN_RUNNER } from './movement';
import type { FracBox } from './templates';

export interface WagerParams extends FrontParams {
	accentHex: string;
	tintHex: string;
	gainHex: string;
	lossHex: string;
	betPt: number;
	bodyPt: number;
	bodyMinPt: number;
	betLabels: Record<string, string>;
	tierLabel: string;
	placeHeader: string;
	coinsHeader: string;
	otherLabel: string;
	betBox: FracBox;
	tableBox: FracBox;
	artBox: FracBox;
	tableBoxWithArt: FracBox;
}

/** 1st, 2nd, 3rd, 4th … 11th, 12th, 13th, 21st (English ordinal suffixes). */
export function ordinal(n: number): string {
	const tens = n % 100;
	if (tens >= 11 && tens <= 13) return `${n}th`;
	return `${n}${{ 1: 'st', 2: 'nd', 3: 'rd' }[n % 10] ?? 'th'}`;
}

/** Coins with their sign: +5, −2 (a true minus sign, U+2212, not a hyphen), 0. */
export function formatCoins(coins: number): string {
	if (coins > 0) return `+${coins}`;
	if (coins < 0) return `\u2212${Math.abs(coins)}`;
	return '0';
}

export interface MoneyLine {
	label: string;
	coins: number;
}

/** The table's lines in printing order: places ascending, then every other place. */
export function moneyLines(table: MoneyTable, otherLabel: string): MoneyLine[] {
	const lines = [...table.rows].sort((a, b) => a.place - b.place).map((r) => ({ label: ordinal(r.place), coins: r.coins }));
	if (table.otherCoins !== undefined) lines.push({ label: otherLabel, coins: table.otherCoins });
	return lines;
}

/** Share of a row's height the line box (ascent + descent ≈ 1.32 em in Roboto Slab) may take. */
const ROW_FILL = 0.62;
const LINE_BOX_EM = 1.32;
const MAX_ROW_MM = 8.5;
const COLUMN_GAP_MM = 3;

function drawMoneyTable(ctx: FaceContext<WagerParams>, table: MoneyTable, box: Box) {
	const { b, params: p } = ctx;
	let y = box.yMm;
	const padMm = 1.5;
	if (p.show.tableName) {
		const r = b.text(table.name, { xMm: box.xMm, yMm: y, wMm: box.wMm, hMm: 5 }, {
			maxPt: 8,
			minPt: 5,
			weight: 'bold',
			align: 'center',
			valign: 'top',
			wrap: false,
			ellipsis: true,
			fill: hex(legibleOn(p.accentHex, p.backgroundHex)),
			label: 'money table name'
		});
		y += r.heightMm + 0.8;
	}
	const lines = moneyLines(table, p.otherLabel);
	if (lines.length === 0) {
		b.warn(`money table “${table.name}” has no rows`);
		return;
	}
	const headMm = 4;
	const freeMm = box.yMm + box.hMm - y - headMm;
	// The smallest row that still holds a line at the minimum size.
	const minRowMm = (LINE_BOX_EM * p.bodyMinPt * MM_PER_PT) / ROW_FILL;
	// A long table on a small card goes to two columns before its rows get too tight.
	const columns = freeMm / lines.length < minRowMm && lines.length > 3 ? 2 : 1;
	const perColumn = Math.ceil(lines.length / columns);
	let rowMm = Math.min(MAX_ROW_MM, freeMm / perColumn);
	if (rowMm < minRowMm) {
		b.warn(
			`money table “${table.name}” needs ${(perColumn * minRowMm).toFixed(1)} mm for its ${lines.length} rows at ${p.bodyMinPt} pt but has ${freeMm.toFixed(1)} mm; it runs past its box`
		);
		rowMm = minRowMm;
	}
	// One size for every row, so the table reads as a table.
	const sizePt = Math.max(p.bodyMinPt, Math.min(p.bodyPt, (rowMm * ROW_FILL) / (LINE_BOX_EM * MM_PER_PT)));
	const colW = (box.wMm - (columns - 1) * COLUMN_GAP_MM) / columns;
	const head = { maxPt: 6.5, minPt: 4.5, valign: 'middle' as const, wrap: false, ellipsis: true, fill: hex(p.mutedHex) };
	for (let c = 0; c < columns; c++) {
		const x = box.xMm + c * (colW + COLUMN_GAP_MM);
		const left: Box = { xMm: x + padMm, yMm: y, wMm: colW * 0.6 - padMm, hMm: headMm };
		const right: Box = { xMm: x + colW * 0.6, yMm: y, wMm: colW * 0.4 - padMm, hMm: headMm };
		b.text(p.placeHeader, left, { ...head, align: 'left', label: 'money table header' });
		b.text(p.coinsHeader, right, { ...head, align: 'right', label: 'money table header' });
		b.add(
			{ type: 'line', x1Mm: x, y1Mm: y + headMm, x2Mm: x + colW, y2Mm: y + headMm, stroke: hex(p.frameHex), strokeMm: 0.3 },
			'money table'
		);
		lines.slice(c * perColumn, (c + 1) * perColumn).forEach((line, i) => {
			const rowY = y + headMm + i * rowMm;
			if (i % 2 === 1)
				b.add({ type: 'rect', xMm: x, yMm: rowY, wMm: colW, hMm: rowMm, radiusMm: 1, fill: hex(p.tintHex) }, 'money table');
			// Money is never cut short: a cell that does not fit warns instead.
			const cell = { valign: 'middle' as const, wrap: false, maxPt: sizePt, minPt: p.bodyMinPt };
			b.text(line.label, { ...left, yMm: rowY, hMm: rowMm }, {
				...cell,
				align: 'left',
				fill: hex(p.inkHex),
				label: `money table place ${line.label}`
			});
			b.text(formatCoins(line.coins), { ...right, yMm: rowY, hMm: rowMm }, {
				...cell,
				align: 'right',
				weight: 'bold',
				fill: hex(legibleOn(line.coins > 0 ? p.gainHex : line.coins < 0 ? p.lossHex : p.inkHex, i % 2 === 1 ? p.tintHex : p.backgroundHex)),
				label: `money table coins for ${line.label}`
			});
		});
	}
}

export function drawWager(ctx: FaceContext<WagerParams>, data: WagerData) {
	const { b, game, params: p } = ctx;
	const runner = game.runners.find((r) => r.id === data.runnerId);
	if (!runner) b.warn(`runner ${data.runnerId} is not in the game`);
	const r = runner ?? UNKNOWN_RUNNER;

	drawGround(b, p.backgroundHex);
	const { panel } = drawBand(b, p, {
		colour: runnerColour(r),
		symbol: runner?.symbol,
		title: p.show.runnerName ? r.name : '',
		titleLabel: 'runner name',
		badge: p.show.tier ? { text: String(data.tier), caption: p.tierLabel } : undefined
	});
	drawFrame(b, p, panel);

	if (p.show.bet)
		b.text(p.betLabels[data.betType] ?? data.betType, b.place(p.betBox), {
			maxPt: p.betPt,
			minPt: 6,
			weight: 'bold',
			align: 'center',
			valign: 'middle',
			maxLines: 1,
			fill: hex(legibleOn(p.accentHex, p.backgroundHex)),
			label: 'bet'
		});
	const art = p.show.art ? slotArt(ctx, runner?.id) : undefined;
	if (art) drawSlot(ctx, b.place(p.artBox), art, p.tintHex);
	const table = game.moneyTables.find((t) => t.id === data.moneyTableId);
	const tableBox = b.place(art ? p.tableBoxWithArt : p.tableBox);
	if (table) drawMoneyTable(ctx, table, tableBox);
	else {
		b.warn(`money table ${data.moneyTableId} is not in the game`);
		b.text('no money table', tableBox, {
			maxPt: 9,
			minPt: 6,
			align: 'center',
			valign: 'middle',
			fill: hex(p.lossHex),
			label: 'missing money table'
		});
	}
}
