/**
 * The cutting guide: the last page of a sheet PDF. Where to cut each sheet (measured from the
 * sheet's edges, front side up), a small map of the grid, and the cautions a person with a
 * blade should read first.
 */
import { type PDFDocument, type PDFFont, type PDFPage } from 'pdf-lib';
import { mmToPt, paperSize, PT_PER_MM } from './paper';
import type { PdfFaceWriter } from './pdf';
import type { SheetOptions, SheetPlan } from './sheet-plan';

export const SAFETY_NOTE =
	'Blades are sharp. Craft knives, rotary cutters and guillotines: cut away from yourself, keep your fingers ' +
	'clear of the blade’s path, use a cutting mat and a metal ruler, close or retract the blade when you put it ' +
	'down, and keep blades away from children.';

export const PRINT_SHOP_NOTE =
	'Card sizes and bleed used here are common practice, not a standard. Before a paid print run, confirm sizes, ' +
	'bleed and file requirements against your print shop’s own specification.';

export const SCALE_NOTE =
	'Print at actual size (100 %, no “fit to page”), or the cards and cut lines will not match this guide.';

const LAYOUT_WORDS = {
	spaced: 'spaced (each card keeps its own bleed; two cuts between neighbours)',
	butted: 'butted (neighbours share one cut line)',
	fold: 'fold-and-glue (front and back side by side; fold, glue the blank sides, then cut)'
};

export function drawCuttingGuide(
	doc: PDFDocument,
	writer: PdfFaceWriter,
	input: { title: string; versionLabel: string; plan: SheetPlan; options: SheetOptions }
): PDFPage {
	const paper = paperSize(input.options.paper);
	const W = paper.widthMm;
	const H = paper.heightMm;
	const page = doc.addPage([mmToPt(W), mmToPt(H)]);
	page.setMediaBox(0, 0, mmToPt(W), mmToPt(H));
	const regular = writer.font('regular');
	const bold = writer.font('bold');
	const ink = writer.paint({ hex: '#000000', cmyk: [0, 0, 0, 1] });
	const grey = writer.paint({ hex: '#b3b3b3', cmyk: [0, 0, 0, 0.3] });
	const k = PT_PER_MM;
	// Keep well inside any printer's margin.
	const left = Math.max(input.options.marginMm, 0) + 10;
	const width = W - 2 * left;
	let y = Math.max(input.options.marginMm, 0) + 12;

	const text = (s: string, sizePt: number, font: PDFFont = regular, indentMm = 0) => {
		for (const line of wrap(s, font, sizePt, (width - indentMm) * k)) {
			page.drawText(line, { x: (left + indentMm) * k, y: (H - y) * k, size: sizePt, font, color: ink });
			y += (sizePt * 1.35) / k;
		}
	};
	const list = (v: number[]) => v.map((n) => (Math.round(n * 10) / 10).toFixed(1)).join(', ');

	text(`Cutting guide — ${input.title}, ${input.versionLabel}`, 14, bold);
	y += 2;
	text(SCALE_NOTE, 9);
	y += 3;

	// Each size: its words on the left, a small map of the sheet on the right, so several sizes share the page.
	const mapBox = { widthMm: 60, heightMm: 42 };
	const textWidth = width - mapBox.widthMm - 6;
	const groups = input.plan.groups;
	for (let i = 0; i < groups.length; i++) {
		const group = groups[i];
		const imp = group.imposition;
		const sheets = new Set(group.pages.map((p) => p.sheet));
		const top = y;
		const para = (s: string, sizePt: number, font: PDFFont = regular) => {
			for (const line of wrap(s, font, sizePt, textWidth * k)) {
				page.drawText(line, { x: left * k, y: (H - y) * k, size: sizePt, font, color: ink });
				y += (sizePt * 1.35) / k;
			}
		};
		para(
			`${fmt(group.trimWidthMm)} × ${fmt(group.trimHeightMm)} mm cards, bleed ${fmt(group.bleedMm)} mm ` +
				`(${group.kindKeys.join(', ')}): ${group.cardCount} cards on ${sheets.size} ` +
				`${sheets.size === 1 ? 'sheet' : 'sheets'}, ${paper.label} ${imp.orientation}, ${imp.columns} × ${imp.rows} per sheet.`,
			9.5,
			bold
		);
		para(`Layout: ${LAYOUT_WORDS[imp.layout]}.`, 8.5);
		para(`Cut down the sheet at these distances from its left edge (mm): ${list(imp.cutsXMm)}.`, 8.5);
		para(`Cut across the sheet at these distances from its top edge (mm): ${list(imp.cutsYMm)}.`, 8.5);
		if (imp.foldsXMm.length) para(`Fold at these distances from the left edge (mm): ${list(imp.foldsXMm)}.`, 8.5);
		const mapBottom = drawMap(page, imp, left + width - mapBox.widthMm, top, H, mapBox, { ink, grey });
		y = Math.max(y, mapBottom) + 6;
		if (i < groups.length - 1 && y > H - 110) {
			text(`${groups.length - i - 1} more card sizes are not shown here: print them with the cutting guide turned on for those kinds alone.`, 9, bold);
			break;
		}
	}

	y = Math.max(y, H - 62);
	text('Safety', 11, bold);
	text(SAFETY_NOTE, 9);
	y += 2;
	text('Print shop', 11, bold);
	text(PRINT_SHOP_NOTE, 9);
	return page;
}

/** A small scale drawing of one sheet: the cards in grey, the cut lines over them. */
function drawMap(
	page: PDFPage,
	imp: SheetPlan['groups'][number]['imposition'],
	leftMm: number,
	topMm: number,
	pageHeightMm: number,
	box: { widthMm: number; heightMm: number },
	c: { ink: ReturnType<PdfFaceWriter['paint']>; grey: ReturnType<PdfFaceWriter['paint']> }
): number {
	const k = PT_PER_MM;
	const scale = Math.min(box.widthMm / imp.sheetWidthMm, box.heightMm / imp.sheetHeightMm);
	const X = (mm: number) => (leftMm + mm * scale) * k;
	const Y = (mm: number) => (pageHeightMm - topMm - mm * scale) * k;
	page.drawRectangle({
		x: X(0),
		y: Y(imp.sheetHeightMm),
		width: imp.sheetWidthMm * scale * k,
		height: imp.sheetHeightMm * scale * k,
		borderColor: c.ink,
		borderWidth: 0.5
	});
	for (const s of imp.slots) {
		const t = s.trimBox;
		page.drawRectangle({ x: X(t.xMm), y: Y(t.yMm + t.heightMm), width: t.widthMm * scale * k, height: t.heightMm * scale * k, color: c.grey });
	}
	for (const x of imp.cutsXMm) page.drawLine({ start: { x: X(x), y: Y(0) }, end: { x: X(x), y: Y(imp.sheetHeightMm) }, thickness: 0.4, color: c.ink });
	for (const y of imp.cutsYMm) page.drawLine({ start: { x: X(0), y: Y(y) }, end: { x: X(imp.sheetWidthMm), y: Y(y) }, thickness: 0.4, color: c.ink });
	for (const x of imp.foldsXMm)
		page.drawLine({ start: { x: X(x), y: Y(0) }, end: { x: X(x), y: Y(imp.sheetHeightMm) }, thickness: 0.4, color: c.ink, dashArray: [2, 2] });
	return topMm + imp.sheetHeightMm * scale;
}

/** Greedy word wrap by the font's own advance widths. */
export function wrap(s: string, font: PDFFont, sizePt: number, widthPt: number): string[] {
	const lines: string[] = [];
	let line = '';
	for (const word of s.split(/\s+/).filter(Boolean)) {
		const next = line ? `${line} ${word}` : word;
		if (line && font.widthOfTextAtSize(next, sizePt) > widthPt) {
			lines.push(line);
			line = word;
		} else line = next;
	}
	if (line) lines.push(line);
	return lines;
}

const fmt = (v: number) => String(Math.round(v * 100) / 100);
