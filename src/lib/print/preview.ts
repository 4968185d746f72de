/**
 * A picture of one imposed sheet as SVG, for the print page to show before anyone downloads:
 * the sheet, its printer margin, each card's face where the imposition puts it (clipped as the
 * PDF clips it) and the crop marks. Drawn from the same plan as the PDF (./sheets.ts planSheets).
 */

import type { PlannedPage, SheetGroup } from './sheet-plan';
import { sheetMarks } from './marks';
import { renderSvg, type ImageSource } from './svg';

const f = (v: number) => `${Math.round(v * 1000) / 1000}`;

/** Strips the XML prolog so a face's SVG can nest inside the sheet's. */
function inner(svg: string): string {
	return svg.replace(/^<\?xml[^>]*>\s*/, '');
}

export function sheetPreviewSvg(group: SheetGroup, page: PlannedPage, images: ImageSource, marks: boolean): string {
	const imp = group.imposition;
	const W = imp.sheetWidthMm;
	const H = imp.sheetHeightMm;
	const m = imp.marginMm;
	const parts: string[] = [];
	parts.push(`<rect x="0" y="0" width="${f(W)}" height="${f(H)}" fill="#ffffff"/>`);
	// The printer margin, shaded: nothing is printed there.
	parts.push(
		`<path d="M0 0H${f(W)}V${f(H)}H0Z M${f(m)} ${f(m)}V${f(H - m)}H${f(W - m)}V${f(m)}Z" fill="#e9eef0" fill-rule="evenodd"/>`
	);
	page.cards.forEach((placed, i) => {
		const { bleedBox: b, clipBox: c } = placed.slot;
		const id = `clip${i}`;
		parts.push(`<clipPath id="${id}"><rect x="${f(c.xMm)}" y="${f(c.yMm)}" width="${f(c.widthMm)}" height="${f(c.heightMm)}"/></clipPath>`);
		// Each face's own clip ids get a prefix: nested in one document they would collide.
		const face = inner(renderSvg(placed.face, images))
			.replace(/id="clip/g, `id="c${i}-clip`)
			.replace(/url\(#clip/g, `url(#c${i}-clip`)
			.replace(/^<svg\b/, `<svg x="${f(b.xMm)}" y="${f(b.yMm)}"`)
			.replace(/\swidth="[^"]*mm"/, ` width="${f(b.widthMm)}"`)
			.replace(/\sheight="[^"]*mm"/, ` height="${f(b.heightMm)}"`);
		parts.push(`<g clip-path="url(#${id})">${face}</g>`);
	});
	if (marks && page.side === 'front') {
		for (const l of sheetMarks(imp, { cropMarks: true }).lines) {
			parts.push(`<line x1="${f(l.x1Mm)}" y1="${f(l.y1Mm)}" x2="${f(l.x2Mm)}" y2="${f(l.y2Mm)}" stroke="#000" stroke-width="0.12"${l.kind === 'fold' ? ' stroke-dasharray="1 1"' : ''}/>`);
		}
	}
	return `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="${f(W)}mm" height="${f(H)}mm" viewBox="0 0 ${f(W)} ${f(H)}">${parts.join('')}</svg>`;
}
