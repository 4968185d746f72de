/**
 * The imposed sheet PDF: every card of a game laid out on sheets for home printing or a shop.
 *
 * Cards of one size (trim and bleed) share sheets; each size gets its own. A sheet's front page
 * carries the cards, crop marks and a label; with duplex, the back page follows straight after
 * it, each back placed behind its own front (see ./duplex.ts). The fold layout puts fronts and
 * backs on one page instead. An optional last page is the cutting guide.
 *
 * `planSheets` (./sheet-plan.ts) decides which card goes where; `buildSheetPdf` draws the plan.
 */
import { drawObject, PDFDocument, popGraphicsState, pushGraphicsState, type PDFPage, type PDFRef } from 'pdf-lib';
import type { ImageAsset } from './display-list';
import { faceHeightMm } from './display-list';
import { drawCuttingGuide } from './cutting-guide';
import { countPages, planSheets, type PlacedCard, type SheetFace, type SheetOptions } from './sheet-plan';
import { loadFontFiles, type FontFiles } from './fonts';
import { drawSheetMarks, sheetMarks } from './marks';
import { mmToPt, PT_PER_MM } from './paper';
import { drawIntoForm, packPageContent, PdfFaceWriter } from './pdf';
import type { EncodedImageStore } from './pdf-image';
import { finishPdfx, pressOutput, savePdfx, type PdfxTarget } from './pdfx';

export interface SheetPdfInput {
	title: string;
	versionLabel: string;
	/** As it should read on the label, e.g. 2025-06-01. */
	date: string;
	faces: SheetFace[];
	images?: ImageAsset[] | ReadonlyMap<string, ImageAsset>;
	options: SheetOptions;
	fonts?: FontFiles;
	/** Encoded image pixels kept between documents (see ./pdf-image.ts). */
	imageStore?: EncodedImageStore;
	/** Called after each page is drawn, with the pages done and the document's page count. */
	onPage?: (done: number, total: number) => void;
	/** A PDF/X file for a press profile instead of plain RGB or CMYK. */
	pdfx?: PdfxTarget;
	/** Told of colours and pictures over the profile's total ink limit (PDF/X only). */
	onInkOver?: (what: string, pct: number, imageId?: string) => void;
}

export async function buildSheetPdf(input: SheetPdfInput): Promise<Uint8Array> {
	const o = input.options;
	const plan = planSheets(input);
	const doc = await PDFDocument.create();
	doc.setTitle(`${input.title} — ${input.versionLabel} — sheets`);
	doc.setProducer('Paddock');
	doc.setCreator('Paddock');
	// The label's date is the document's date too, so the same input gives the same bytes.
	const stamp = new Date(`${input.date}T00:00:00Z`);
	if (!Number.isNaN(stamp.getTime())) {
		doc.setCreationDate(stamp);
		doc.setModificationDate(stamp);
	}
	const pdfx = input.pdfx;
	const title = `${input.title} — ${input.versionLabel} — sheets`;
	const seed = `${title}|${input.date}|${pdfx?.standard}|${pdfx?.intent}`;
	const writer = await PdfFaceWriter.create(doc, {
		fonts: input.fonts ?? (await loadFontFiles()),
		images: input.images,
		colour: o.colour,
		imageStore: input.imageStore,
		// A card printed many times is drawn once and placed by reference.
		faceForms: true,
		...(pdfx && { press: await pressOutput(pdfx, seed, input.onInkOver) })
	});
	const labelFont = writer.font('regular');
	const labelColour = writer.paint({ hex: '#000000', cmyk: [0, 0, 0, 1] });
	// Label widths word by word: the page numbers change from page to page, the words repeat, and
	// each word is measured once (at 1 pt; widths scale with the size). Roboto Slab kerns nothing
	// across a space, so the sum is exact.
	const wordPt = new Map<string, number>();
	const widthAt1Pt = (word: string) => {
		let w = wordPt.get(word);
		if (w === undefined) wordPt.set(word, (w = labelFont.widthOfTextAtSize(word, 1)));
		return w;
	};
	const labelWidthPt = (t: string, pt: number) => {
		const words = t.split(' ');
		let w = (words.length - 1) * widthAt1Pt(' ');
		for (const word of words) if (word) w += widthAt1Pt(word);
		return w * pt;
	};
	const k = PT_PER_MM;
	const totalPages = countPages(plan, !!o.cuttingGuide).total;
	let pagesDone = 0;

	for (const group of plan.groups) {
		const imp = group.imposition;
		const W = imp.sheetWidthMm;
		const H = imp.sheetHeightMm;
		// The pages of a group mostly share their marks: each set drawn once as a form, placed on every page with it.
		const markForms = new Map<string, Promise<PDFRef>>();
		const size = `${fmt(group.trimWidthMm)} × ${fmt(group.trimHeightMm)} mm`;
		for (const planned of group.pages) {
			const page = doc.addPage([mmToPt(W), mmToPt(H)]);
			page.setMediaBox(0, 0, mmToPt(W), mmToPt(H));
			for (const card of planned.cards) await drawCard(writer, page, card, H);
			const where = `sheet ${planned.sheet} of ${plan.sheetCount} ${planned.side}`;
			const texts = [
				`${input.title} · ${input.versionLabel} · ${size} · ${where} · ${input.date}`,
				`${input.title} · ${input.versionLabel} · ${where} · ${input.date}`,
				`${input.versionLabel} · ${where}`
			];
			if (imp.layout === 'fold' && planned.side === 'front')
				texts.unshift(`${texts[1]} · fold on the dashed marks, glue the blank sides together`);
			const marks = sheetMarks(imp, {
				// Marks go on the front only: that is the side that gets cut.
				cropMarks: o.marks && planned.side === 'front',
				label: { texts, widthMm: (t, pt) => labelWidthPt(t, pt) / k }
			});
			if (marks.lines.length) {
				// The label can shorten a mark, and its text differs per page: key by the lines themselves.
				const key = JSON.stringify(marks.lines);
				if (!markForms.has(key))
					markForms.set(
						key,
						drawIntoForm(doc, mmToPt(W), mmToPt(H), (p) => drawSheetMarks(p, { lines: marks.lines, warnings: [] }, H, { font: labelFont, labelColour }))
					);
				const name = page.node.newXObject('Mk', await markForms.get(key)!);
				page.pushOperators(pushGraphicsState(), drawObject(name), popGraphicsState());
			}
			drawSheetMarks(page, { ...marks, lines: [] }, H, { font: labelFont, labelColour });
			packPageContent(page);
			input.onPage?.(++pagesDone, totalPages);
		}
	}
	if (o.cuttingGuide) {
		drawCuttingGuide(doc, writer, { title: input.title, versionLabel: input.versionLabel, plan, options: o });
		input.onPage?.(++pagesDone, totalPages);
	}
	if (pdfx) {
		finishPdfx(doc, pdfx, { title, date: Number.isNaN(stamp.getTime()) ? new Date() : stamp, seed });
		return savePdfx(doc, pdfx.standard);
	}
	// Written in one go: pdf-lib's default pause every 50 objects cost a third of the save, and
	// large builds run in worker threads (./pool.ts), where nothing else waits for the event loop.
	return doc.save({ objectsPerTick: Number.POSITIVE_INFINITY });
}

async function drawCard(writer: PdfFaceWriter, page: PDFPage, card: PlacedCard, sheetHeightMm: number): Promise<void> {
	const { bleedBox, clipBox } = card.slot;
	const k = PT_PER_MM;
	// The slot is in mm from the sheet's top-left; the face is placed by its bottom-left corner in pt.
	await writer.drawFace(page, card.face, {
		xPt: bleedBox.xMm * k,
		yPt: (sheetHeightMm - bleedBox.yMm - faceHeightMm(card.face)) * k,
		clipPt: {
			xPt: clipBox.xMm * k,
			yPt: (sheetHeightMm - clipBox.yMm - clipBox.heightMm) * k,
			widthPt: clipBox.widthMm * k,
			heightPt: clipBox.heightMm * k
		}
	});
}

const fmt = (v: number) => String(Math.round(v * 100) / 100);
