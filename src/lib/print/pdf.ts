/**
 * The PDF backend: draws one FaceLayout onto a pdf-lib page.
 *
 * The display list is in mm from the face's top-left, y downwards; PDF user space is in pt
 * from the page's bottom-left, y upwards (ISO 32000-1 §8.3.2.3), so every coordinate is
 * converted here and nowhere else. Text is vector text in the embedded Roboto Slab (TrueType,
 * subset); images are embedded once per document and drawn wherever they are used.
 */
import {
	appendBezierCurve,
	clip,
	closePath,
	cmyk,
	concatTransformationMatrix,
	drawObject,
	endPath,
	LineJoinStyle,
	lineTo,
	moveTo,
	PDFArray,
	PDFContentStream,
	PDFDict,
	PDFDocument,
	PDFFont,
	PDFName,
	PDFOperator,
	PDFPage,
	PDFRef,
	popGraphicsState,
	pushGraphicsState,
	rectangle,
	rgb,
	setLineJoin,
	type Color
} from 'pdf-lib';
import { deflateSync } from 'node:zlib';
import type { Colour, DisplayItem, FaceLayout, FontWeight, ImageAsset } from './display-list';
import { faceHeightMm, faceWidthMm } from './display-list';
import type { FontFiles } from './fonts';
import { PT_PER_MM } from './paper';
import { sharedFontkit } from './pdf-fontkit';
import { PdfImageCache, type EncodedImageStore } from './pdf-image';
import type { PressColour } from './colour/cmm';

export type ColourMode = 'rgb' | 'cmyk';


/** Bézier handle length for a quarter circle: 4/3 · (√2 − 1). */
const KAPPA = 0.5522847498;

/** A rectangle in PDF user space (pt, bottom-left origin). */
export interface BoxPt {
	xPt: number;
	yPt: number;
	widthPt: number;
	heightPt: number;
}

export interface FacePlacement {
	/** Bottom-left corner of the face box (trim + bleed) on the page, in pt. */
	xPt: number;
	yPt: number;
	/** Draw only inside this box (butted layouts clip the inner bleed). */
	clipPt?: BoxPt;
}

/**
 * Device CMYK from sRGB hex by the plain complement formula. It is not colour-managed: it only
 * keeps a CMYK document free of RGB operators when a colour has no press value of its own.
 */
export function hexToCmyk(hex: string): [number, number, number, number] {
	const [r, g, b] = hexToRgb(hex);
	const k = 1 - Math.max(r, g, b);
	if (k >= 1) return [0, 0, 0, 1];
	return [(1 - r - k) / (1 - k), (1 - g - k) / (1 - k), (1 - b - k) / (1 - k), k];
}

export function hexToRgb(hex: string): [number, number, number] {
	let h = hex.trim().replace(/^#/, '');
	if (h.length === 3) h = [...h].map((c) => c + c).join('');
	if (!/^[0-9a-f]{6}$/i.test(h)) throw new Error(`not a hex colour: ${hex}`);
	const n = parseInt(h, 16);
	return [((n >> 16) & 255) / 255, ((n >> 8) & 255) / 255, (n & 255) / 255];
}

export function pdfColour(colour: Colour, mode: ColourMode): Color {
	if (mode === 'cmyk') {
		const [c, m, y, k] = colour.cmyk ?? hexToCmyk(colour.hex);
		return cmyk(c, m, y, k);
	}
	const [r, g, b] = hexToRgb(colour.hex);
	return rgb(r, g, b);
}

/** An SVG path for a rounded rectangle (mm, y down) — pdf-lib's rectangle has no corner radius. */
export function roundedRectPath(x: number, y: number, w: number, h: number, radius: number): string {
	const r = Math.max(0, Math.min(radius, w / 2, h / 2));
	const c = r * (1 - KAPPA);
	const n = (v: number) => +v.toFixed(4);
	return [
		`M ${n(x + r)} ${n(y)}`,
		`H ${n(x + w - r)}`,
		`C ${n(x + w - c)} ${n(y)} ${n(x + w)} ${n(y + c)} ${n(x + w)} ${n(y + r)}`,
		`V ${n(y + h - r)}`,
		`C ${n(x + w)} ${n(y + h - c)} ${n(x + w - c)} ${n(y + h)} ${n(x + w - r)} ${n(y + h)}`,
		`H ${n(x + r)}`,
		`C ${n(x + c)} ${n(y + h)} ${n(x)} ${n(y + h - c)} ${n(x)} ${n(y + h - r)}`,
		`V ${n(y + r)}`,
		`C ${n(x)} ${n(y + c)} ${n(x + c)} ${n(y)} ${n(x + r)} ${n(y)}`,
		'Z'
	].join(' ');
}

/**
 * Press output (PDF/X): colours and pictures through the press profile, fonts subset and named
 * with a subset tag, the standard's limits on transparency.
 */
export interface PressOutput {
	colour: PressColour;
	/** False for PDF/X-1a (ISO 15930-4 forbids transparency). */
	allowTransparency: boolean;
	/** Six capital letters for the subset fonts' names (ISO 32000-1 §9.6.4), e.g. from a hash of the document. */
	subsetTag: string;
	/** Highest total ink the condition allows, in %. */
	totalInkLimitPct: number;
	/** Told of every colour or picture whose total ink is over the limit (each once); a picture's own id comes with it. */
	onInkOver?: (what: string, pct: number, imageId?: string) => void;
}

export interface PdfFaceWriterOptions {
	/** The font files (their metrics are not needed: faces arrive laid out). */
	fonts: FontFiles;
	/** Image table shared by all faces of the document, keyed by image id. */
	images?: Iterable<ImageAsset> | ReadonlyMap<string, ImageAsset>;
	colour?: ColourMode;
	/** Encoded image pixels kept between documents (see ./pdf-image.ts). */
	imageStore?: EncodedImageStore;
	/**
	 * Draw each distinct face (the same FaceLayout object) once per document as a form XObject
	 * (ISO 32000-1 §8.10) and place that wherever the face recurs: ten copies of a card cost one
	 * drawing, and the file grows with distinct faces, not with copies.
	 */
	faceForms?: boolean;
	/** Press output through a profile (implies CMYK). */
	press?: PressOutput;
}

/**
 * A face's form content kept between documents, by the FaceLayout object (the print cache hands
 * out the same object while the face is unchanged): the bytes name resources canonically and
 * refer to the fonts' own glyph ids, so only the texts' glyphs need registering again.
 */
interface KeptForm extends FormRecord {
	/** The font files the glyph ids refer to. */
	fonts: [Uint8Array, Uint8Array];
}

/** A face's form content as it can be kept outside the process (see ./disk-cache.ts). */
export interface FormRecord {
	colour: ColourMode;
	/** Deflated content stream. */
	content: Uint8Array;
	/** Image ids in the order of their names I0, I1, … */
	images: string[];
	texts: [FontWeight, string][];
}
const keptForms = new WeakMap<FaceLayout, KeptForm>();

const sameFonts = (kept: KeptForm, fonts: FontFiles) => kept.fonts[0] === fonts.regular.ttf && kept.fonts[1] === fonts.bold.ttf;

/** The face's form as drawn in an earlier document of this process (plain RGB or CMYK only), to keep elsewhere. */
export function keptFormOf(face: FaceLayout): FormRecord | undefined {
	const kept = keptForms.get(face);
	return kept && { colour: kept.colour, content: kept.content, images: kept.images, texts: kept.texts };
}

/** A form kept elsewhere, for documents of this process drawn with these font files. */
export function keepForm(face: FaceLayout, form: FormRecord, fonts: FontFiles): void {
	keptForms.set(face, { ...form, fonts: [fonts.regular.ttf, fonts.bold.ttf] });
}

const escapeRegExp = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/**
 * Draws faces into one document. Holds what must be embedded once per document: the two
 * font weights and the images.
 */
export class PdfFaceWriter {
	readonly colour: ColourMode;
	readonly images: PdfImageCache;
	readonly faceForms: boolean;
	/** How many form XObjects were written (for tests: once per distinct face per document). */
	formsWritten = 0;
	private forms = new WeakMap<FaceLayout, Promise<PDFRef>>();
	private fontSet: FontFiles;
	private formNames = new WeakMap<PDFPage, Map<PDFRef, PDFName>>();
	private press?: PressOutput;
	private inkReported = new Set<string>();

	private constructor(
		readonly doc: PDFDocument,
		private fonts: Record<FontWeight, PDFFont>,
		images: ReadonlyMap<string, ImageAsset>,
		options: PdfFaceWriterOptions
	) {
		this.press = options.press;
		this.colour = options.press ? 'cmyk' : (options.colour ?? 'rgb');
		this.faceForms = !!options.faceForms;
		this.fontSet = options.fonts;
		const press = options.press;
		this.images = new PdfImageCache(
			doc,
			images,
			options.imageStore,
			press && {
				colour: press.colour,
				allowTransparency: press.allowTransparency,
				onInk: (id, pct) => this.checkInk(`a picture (${id.slice(0, 12)})`, pct, id)
			}
		);
	}

	private checkInk(what: string, pct: number, imageId?: string): void {
		if (!this.press || pct <= this.press.totalInkLimitPct + 0.5 || this.inkReported.has(what)) return;
		this.inkReported.add(what);
		this.press.onInkOver?.(what, pct, imageId);
	}

	static async create(doc: PDFDocument, options: PdfFaceWriterOptions): Promise<PdfFaceWriter> {
		// One parsed font and its shaped strings for every document of the process.
		doc.registerFontkit(sharedFontkit);
		nativeFlate(doc);
		// TrueType bytes, never woff2 (pdf-lib would write invisible glyphs). Subset to the glyphs
		// used, except with face forms: forms kept between documents use the font's own glyph ids,
		// so the whole font goes in (the shipped Latin set is 28 KB a weight). Press files always
		// subset (PDF/X preflight expects it) and draw their forms afresh.
		const subset = !!options.press || !options.faceForms;
		// A subset font's name is its PostScript name behind a tag of six capitals (ISO 32000-1 §9.6.4).
		const name = (f: FontFiles['regular'], n: number) =>
			options.press
				? { customName: `${subsetTag(options.press.subsetTag, n)}+${sharedFontkit.create(f.ttf).postscriptName ?? `RobotoSlab-${f.weight}`}` }
				: {};
		const [regular, bold] = await Promise.all([
			doc.embedFont(new Uint8Array(options.fonts.regular.ttf), { subset, ...name(options.fonts.regular, 0) }),
			doc.embedFont(new Uint8Array(options.fonts.bold.ttf), { subset, ...name(options.fonts.bold, 1) })
		]);
		const table = new Map<string, ImageAsset>();
		if (options.images instanceof Map) for (const [id, a] of options.images) table.set(id, a);
		else for (const a of (options.images ?? []) as Iterable<ImageAsset>) table.set(a.id, a);
		return new PdfFaceWriter(doc, { regular, bold }, table, options);
	}

	font(weight: FontWeight): PDFFont {
		return this.fonts[weight];
	}

	paint(colour: Colour): Color {
		if (!this.press) return pdfColour(colour, this.colour);
		// A colour's own press value (a runner's CMYK) as given; anything else through the profile.
		const [c, m, y, k] = colour.cmyk ?? this.press.colour.cmykOf(colour.hex);
		this.checkInk(colour.cmyk ? `the colour C${pct(c)} M${pct(m)} Y${pct(y)} K${pct(k)}` : `the colour ${colour.hex}`, (c + m + y + k) * 100);
		return cmyk(c, m, y, k);
	}

	/** Draws the whole face with its bottom-left bleed corner at the placement (pt). */
	async drawFace(page: PDFPage, face: FaceLayout, at: FacePlacement): Promise<void> {
		if (!this.faceForms) return this.drawItems(page, face, at);
		const name = this.formName(page, await this.faceForm(face));
		const ops: PDFOperator[] = [pushGraphicsState()];
		const { widthPt, heightPt } = faceSizePt(face);
		const c = at.clipPt;
		const near = (a: number, b: number) => Math.abs(a - b) < 1e-6;
		// A form is clipped to its BBox, the face box (ISO 32000-1 §8.10.1): a clip to that same box adds nothing.
		if (c && !(near(c.xPt, at.xPt) && near(c.yPt, at.yPt) && near(c.widthPt, widthPt) && near(c.heightPt, heightPt)))
			ops.push(rectangle(c.xPt, c.yPt, c.widthPt, c.heightPt), clip(), endPath());
		// The form is drawn in its own space with the face's bottom-left at the origin (§8.10.1).
		ops.push(concatTransformationMatrix(1, 0, 0, 1, at.xPt, at.yPt), drawObject(name), popGraphicsState());
		page.pushOperators(...ops);
	}

	/** The face's form XObject in this document, drawn on first use. */
	private faceForm(face: FaceLayout): Promise<PDFRef> {
		let form = this.forms.get(face);
		if (!form) {
			form = this.writeForm(face);
			this.forms.set(face, form);
		}
		return form;
	}

	private async writeForm(face: FaceLayout): Promise<PDFRef> {
		// Press forms hold subset glyph ids and one profile's colours: never kept between documents.
		const kept = this.press ? undefined : keptForms.get(face);
		const form =
			kept && kept.colour === this.colour && sameFonts(kept, this.fontSet) ? this.replay(kept) : await this.drawForm(face);
		this.formsWritten++;
		const { widthPt, heightPt } = faceSizePt(face);
		const { context } = this.doc;
		const images: Record<string, PDFRef> = {};
		for (let i = 0; i < form.images.length; i++) images[`I${i}`] = await this.images.ref(form.images[i]);
		return context.register(
			context.stream(form.content, {
				Type: 'XObject',
				Subtype: 'Form',
				BBox: [0, 0, widthPt, heightPt],
				Resources: { Font: { FR: this.fonts.regular.ref, FB: this.fonts.bold.ref }, XObject: images },
				Filter: 'FlateDecode'
			})
		);
	}

	/**
	 * Draws the face on a page that never joins the page tree, then takes its content with the
	 * resource names made canonical (FR, FB for the fonts, I0… for images), so the same bytes
	 * serve any later document (see `keptForms`).
	 */
	private async drawForm(face: FaceLayout): Promise<KeptForm> {
		const { parts, resources } = await drawOffPage(this.doc, (scratch) => this.drawItems(scratch, face, { xPt: 0, yPt: 0 }));

		// Canonical names for what the page's resources named at random.
		const images = [...new Set(face.items.flatMap((i) => (i.type === 'image' ? [i.imageId] : [])))];
		const imageByRef = new Map<PDFRef, string>();
		for (const id of images) imageByRef.set(await this.images.ref(id), id);
		const renames = new Map<string, string>();
		for (const [key, value] of resources?.entries() ?? []) {
			const dict = value instanceof PDFDict ? value : undefined;
			if (key === PDFName.of('Font') && dict)
				for (const [name, ref] of dict.entries()) renames.set(name.decodeText(), ref === this.fonts.bold.ref ? 'FB' : 'FR');
			else if (key === PDFName.of('XObject') && dict)
				for (const [name, ref] of dict.entries()) renames.set(name.decodeText(), `I${images.indexOf(imageByRef.get(ref as PDFRef)!)}`);
			// pdf-lib adds empty dictionaries of other kinds; a face never fills them (no opacity, no patterns).
			else if (key !== PDFName.of('ProcSet') && !(dict && dict.entries().length === 0))
				throw new Error(`a face uses page resources of type ${key.decodeText()}, which forms do not carry`);
		}
		let text = Buffer.concat(parts).toString('latin1');
		if (renames.size) {
			const pattern = new RegExp(`/(${[...renames.keys()].map(escapeRegExp).join('|')})(?=[\\s/\\[\\]<>(){}%]|$)`, 'g');
			text = text.replace(pattern, (_, name: string) => `/${renames.get(name)}`);
		}
		const form: KeptForm = {
			colour: this.colour,
			fonts: [this.fontSet.regular.ttf, this.fontSet.bold.ttf],
			content: new Uint8Array(deflateSync(Buffer.from(text, 'latin1'))),
			images,
			texts: face.items.flatMap((i) => (i.type === 'text' && i.text ? [[i.weight, i.text] as [FontWeight, string]] : []))
		};
		if (!this.press) keptForms.set(face, form);
		return form;
	}

	/** A kept form in this document: its glyphs registered with this document's fonts (widths, ToUnicode). */
	private replay(kept: KeptForm): KeptForm {
		for (const [weight, text] of kept.texts) this.fonts[weight].encodeText(text);
		return kept;
	}

	/** The form's resource name on this page, added to the page once. */
	private formName(page: PDFPage, ref: PDFRef): PDFName {
		let names = this.formNames.get(page);
		if (!names) this.formNames.set(page, (names = new Map()));
		let name = names.get(ref);
		if (!name) names.set(ref, (name = page.node.newXObject('Fm', ref)));
		return name;
	}

	private async drawItems(page: PDFPage, face: FaceLayout, at: FacePlacement): Promise<void> {
		const k = PT_PER_MM;
		const left = at.xPt;
		const top = at.yPt + faceHeightMm(face) * k;
		const X = (mm: number) => left + mm * k;
		const Y = (mm: number) => top - mm * k;
		const pathOrigin = { x: left, y: top, scale: k };

		if (at.clipPt) {
			const c = at.clipPt;
			page.pushOperators(pushGraphicsState(), rectangle(c.xPt, c.yPt, c.widthPt, c.heightPt), clip(), endPath());
		}
		for (const item of face.items) await this.drawItem(page, item, X, Y, pathOrigin);
		if (at.clipPt) page.pushOperators(popGraphicsState());
	}

	private async drawItem(
		page: PDFPage,
		item: DisplayItem,
		X: (mm: number) => number,
		Y: (mm: number) => number,
		pathOrigin: { x: number; y: number; scale: number }
	): Promise<void> {
		const k = PT_PER_MM;
		switch (item.type) {
			case 'rect': {
				const strokeMm = item.strokeMm ?? 0;
				// As in the SVG backend: a stroke needs both a colour and a width.
				const stroked = !!item.stroke && strokeMm > 0;
				if (!item.fill && !stroked) return;
				const fill = item.fill ? { color: this.paint(item.fill) } : {};
				if (item.radiusMm && item.radiusMm > 0) {
					// Path units are mm (drawSvgPath scales them), so the border width stays in mm.
					page.drawSvgPath(roundedRectPath(item.xMm, item.yMm, item.wMm, item.hMm, item.radiusMm), {
						...pathOrigin,
						...fill,
						...(stroked ? { borderColor: this.paint(item.stroke!), borderWidth: strokeMm } : {})
					});
				} else {
					page.drawRectangle({
						x: X(item.xMm),
						y: Y(item.yMm + item.hMm),
						width: item.wMm * k,
						height: item.hMm * k,
						...fill,
						...(stroked ? { borderColor: this.paint(item.stroke!), borderWidth: strokeMm * k } : {})
					});
				}
				return;
			}
			case 'ellipse': {
				const stroked = !!item.stroke && (item.strokeMm ?? 0) > 0;
				if (!item.fill && !stroked) return;
				page.drawEllipse({
					x: X(item.cxMm),
					y: Y(item.cyMm),
					xScale: item.rxMm * k,
					yScale: item.ryMm * k,
					...(item.fill ? { color: this.paint(item.fill) } : {}),
					...(stroked ? { borderColor: this.paint(item.stroke!), borderWidth: item.strokeMm! * k } : {})
				});
				return;
			}
			case 'line': {
				page.drawLine({
					start: { x: X(item.x1Mm), y: Y(item.y1Mm) },
					end: { x: X(item.x2Mm), y: Y(item.y2Mm) },
					thickness: item.strokeMm * k,
					color: this.paint(item.stroke),
					...(item.dashMm?.length ? { dashArray: item.dashMm.map((d) => d * k) } : {})
				});
				return;
			}
			case 'path': {
				const stroked = !!item.stroke && (item.strokeMm ?? 0) > 0;
				if (!item.fill && !stroked) return;
				// Round joins like the SVG backend; drawSvgPath inherits them from the enclosing state.
				page.pushOperators(pushGraphicsState(), setLineJoin(LineJoinStyle.Round));
				page.drawSvgPath(item.d, {
					...pathOrigin,
					...(item.fill ? { color: this.paint(item.fill) } : {}),
					...(stroked ? { borderColor: this.paint(item.stroke!), borderWidth: item.strokeMm! } : {})
				});
				page.pushOperators(popGraphicsState());
				return;
			}
			case 'text': {
				if (!item.text) return;
				page.drawText(item.text, {
					x: X(item.xMm),
					y: Y(item.yMm),
					size: item.sizePt,
					font: this.fonts[item.weight],
					color: this.paint(item.fill)
				});
				return;
			}
			case 'image': {
				const name = await this.images.nameOn(page, item.imageId);
				const ops: PDFOperator[] = [pushGraphicsState()];
				// Cover-fit images overhang their slot: clip to the slot (or the image's own box).
				const box = item.clip ?? item;
				ops.push(...roundedRectOps(X(box.xMm), Y(box.yMm + box.hMm), box.wMm * k, box.hMm * k, (item.radiusMm ?? 0) * k), clip(), endPath());
				// The image's unit square maps onto the box (ISO 32000-1 §8.9.5: images are drawn in the unit square).
				ops.push(concatTransformationMatrix(item.wMm * k, 0, 0, item.hMm * k, X(item.xMm), Y(item.yMm + item.hMm)), drawObject(name), popGraphicsState());
				page.pushOperators(...ops);
				return;
			}
		}
	}
}

/**
 * Runs `draw` on a page that never joins the page tree and takes back what it drew: the content
 * bytes (uncompressed) and the resources it named. The page and its streams leave the document.
 */
async function drawOffPage(
	doc: PDFDocument,
	draw: (page: PDFPage) => Promise<void> | void
): Promise<{ parts: Uint8Array[]; resources: PDFDict | undefined }> {
	const { context } = doc;
	const scratch = PDFPage.create(doc);
	await draw(scratch);
	const parts: Uint8Array[] = [];
	const contents = scratch.node.Contents();
	// pdf-lib keeps a new page's content as an array of refs to its own content streams.
	const refs = contents instanceof PDFArray ? contents.asArray() : [];
	for (const ref of refs) {
		const stream = context.lookup(ref);
		if (!(stream instanceof PDFContentStream) || !(ref instanceof PDFRef)) throw new Error('unexpected page content');
		parts.push(stream.getUnencodedContents());
		context.delete(ref);
	}
	const resources = scratch.node.Resources();
	context.delete(scratch.ref);
	return { parts, resources };
}

/**
 * pdf-lib deflates the streams it makes itself (embedded font files, ToUnicode maps) with a
 * JavaScript port of zlib; Node's zlib is native and many times faster, most of all in a process
 * that starts for one file. The same FlateDecode streams (ISO 32000-1 §7.4.4), made sooner.
 */
function nativeFlate(doc: PDFDocument): void {
	const { context } = doc;
	context.flateStream = (contents: string | Uint8Array, dict = {}) =>
		context.stream(new Uint8Array(deflateSync(typeof contents === 'string' ? Buffer.from(contents, 'latin1') : contents)), { ...dict, Filter: 'FlateDecode' });
}

/**
 * Replaces a finished page's content streams by one stream deflated now by Node's zlib: pdf-lib
 * would deflate each at save with a JavaScript port whose start-up per stream costs more than
 * a small page's whole content. Call it last: anything drawn on the page afterwards is lost.
 */
export function packPageContent(page: PDFPage): void {
	const { context } = page.doc;
	const contents = page.node.Contents();
	if (!(contents instanceof PDFArray)) return;
	const parts: Uint8Array[] = [];
	for (const ref of contents.asArray()) {
		const stream = context.lookup(ref);
		if (!(stream instanceof PDFContentStream) || !(ref instanceof PDFRef)) return;
		parts.push(stream.getUnencodedContents());
	}
	for (const ref of contents.asArray()) context.delete(ref as PDFRef);
	const bytes = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
	parts.reduce((at, p) => (bytes.set(p, at), at + p.length), 0);
	const packed = context.register(context.stream(new Uint8Array(deflateSync(bytes)), { Filter: 'FlateDecode' }));
	page.node.set(PDFName.of('Contents'), context.obj([packed]));
}

/**
 * Whatever `draw` puts on a page of `widthPt` × `heightPt`, as a form XObject of this document
 * (ISO 32000-1 §8.10), to be placed with `Do` as often as needed.
 */
export async function drawIntoForm(
	doc: PDFDocument,
	widthPt: number,
	heightPt: number,
	draw: (page: PDFPage) => Promise<void> | void
): Promise<PDFRef> {
	const { parts, resources } = await drawOffPage(doc, draw);
	const bytes = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
	parts.reduce((at, p) => (bytes.set(p, at), at + p.length), 0);
	return doc.context.register(
		doc.context.stream(new Uint8Array(deflateSync(bytes)), {
			Type: 'XObject',
			Subtype: 'Form',
			BBox: [0, 0, widthPt, heightPt],
			...(resources ? { Resources: resources } : {}),
			Filter: 'FlateDecode'
		})
	);
}

const pct = (v: number) => Math.round(v * 100);

/** Six capitals from a document's tag and a font's number: subsets of one document never share a name. */
export function subsetTag(tag: string, n: number): string {
	const letters = tag.toUpperCase().replace(/[^A-Z]/g, '').padEnd(6, 'A').slice(0, 6);
	const last = String.fromCharCode(65 + ((letters.charCodeAt(5) - 65 + n) % 26));
	return letters.slice(0, 5) + last;
}

/** Rounded rectangle path operators in pt (bottom-left x, y), for clipping. */
function roundedRectOps(x: number, y: number, w: number, h: number, radius: number): PDFOperator[] {
	const r = Math.max(0, Math.min(radius, w / 2, h / 2));
	const c = r * KAPPA;
	return [
		moveTo(x + r, y),
		lineTo(x + w - r, y),
		appendBezierCurve(x + w - r + c, y, x + w, y + r - c, x + w, y + r),
		lineTo(x + w, y + h - r),
		appendBezierCurve(x + w, y + h - r + c, x + w - r + c, y + h, x + w - r, y + h),
		lineTo(x + r, y + h),
		appendBezierCurve(x + r - c, y + h, x, y + h - r + c, x, y + h - r),
		lineTo(x, y + r),
		appendBezierCurve(x, y + r - c, x + r - c, y, x + r, y),
		closePath()
	];
}

/** The face box size in pt. */
export const faceSizePt = (face: FaceLayout) => ({
	widthPt: faceWidthMm(face) * PT_PER_MM,
	heightPt: faceHeightMm(face) * PT_PER_MM
});
