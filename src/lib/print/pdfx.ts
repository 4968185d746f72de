/**
 * PDF/X: the exchange files a commercial print shop accepts (ISO 15930). A PDF/X file says which
 * printing condition its colours were made for and carries that condition's ICC profile, so the
 * shop's preflight can check it and their workflow prints it without guessing:
 *
 * - an `OutputIntents` entry in the catalog, `S /GTS_PDFX`, naming the condition
 *   (`OutputConditionIdentifier`, e.g. FOGRA39) and embedding its CMYK profile as
 *   `DestOutputProfile` (an ICC stream with `N 4`);
 * - `GTS_PDFXVersion` in the document information and, for PDF/X-4, the same in the XMP
 *   metadata (`pdfxid:GTS_PDFXVersion`), with title and dates that match the information;
 * - `Trapped /False` (Paddock leaves trapping to the shop), a file identifier (`ID`);
 * - TrimBox and BleedBox on every page, fonts embedded and subset, colour only as CMYK or grey:
 *   those are the drawing's job (./pdf.ts with a press profile, ./press.ts, ./sheets.ts).
 *
 * PDF/X-4 (ISO 15930-7, PDF 1.6) allows transparency; PDF/X-1a:2003 (ISO 15930-4, PDF 1.4)
 * does not, and its file is written without object streams, which came with PDF 1.5.
 */
import { createHash } from 'node:crypto';
import { deflateSync } from 'node:zlib';
import { PDFDict, PDFDocument, PDFHexString, PDFName, PDFString } from 'pdf-lib';
import { PressColour, type PressProfile, type RenderingIntent } from './colour/cmm';
import type { PressOutput } from './pdf';

export const PDFX_STANDARDS = ['pdfx4', 'pdfx1a'] as const;
export type PdfxStandard = (typeof PDFX_STANDARDS)[number];

/** The identification each standard asks for (ISO 15930-7 §6.2.2, ISO 15930-4 §6.2.2). */
export const PDFX_VERSION: Record<PdfxStandard, string> = {
	pdfx4: 'PDF/X-4',
	pdfx1a: 'PDF/X-1a:2003'
};

const PDF_VERSION: Record<PdfxStandard, [number, number]> = { pdfx4: [1, 6], pdfx1a: [1, 4] };

export interface PdfxTarget {
	standard: PdfxStandard;
	profile: PressProfile;
	intent: RenderingIntent;
}

/**
 * Saves a finished PDF/X document: no object streams before PDF 1.5, and the header's version
 * set to the standard's. pdf-lib always writes `%PDF-1.7`; the version has the same length, so
 * overwriting it moves no byte the cross-reference table points at.
 */
export async function savePdfx(doc: PDFDocument, standard: PdfxStandard): Promise<Uint8Array> {
	const bytes = await doc.save({ useObjectStreams: standard === 'pdfx4', objectsPerTick: Number.POSITIVE_INFINITY });
	const [major, minor] = PDF_VERSION[standard];
	const header = new TextEncoder().encode(`%PDF-${major}.${minor}`);
	if (new TextDecoder().decode(bytes.subarray(0, 5)) !== '%PDF-') throw new Error('pdf-lib wrote no PDF header');
	bytes.set(header, 0);
	return bytes;
}

/** What a face writer needs to draw for the target's press: its colour transform, limits and font tag. */
export async function pressOutput(
	target: PdfxTarget,
	seed: string,
	onInkOver?: (what: string, pct: number, imageId?: string) => void
): Promise<PressOutput> {
	return {
		colour: await PressColour.open(target.profile.icc, target.intent),
		allowTransparency: target.standard === 'pdfx4',
		subsetTag: documentTag(seed),
		totalInkLimitPct: target.profile.totalInkLimitPct,
		onInkOver
	};
}

/** Six capitals from the document's identity: the tag of its subset fonts. */
export function documentTag(seed: string): string {
	const digest = createHash('sha256').update(seed).digest();
	return [...digest.subarray(0, 6)].map((b) => String.fromCharCode(65 + (b % 26))).join('');
}

const xmlText = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

/** ISO 8601 as XMP writes dates (the same instant as the information's PDF dates). */
const xmpDate = (d: Date) => d.toISOString().replace(/\.\d{3}Z$/, 'Z');

/** Deterministic UUID form of a hash, for the XMP document and instance ids. */
function uuidOf(seed: string): string {
	const h = createHash('sha256').update(seed).digest('hex');
	return `uuid:${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20, 32)}`;
}

/**
 * Turns a drawn document into PDF/X: header version, output intent with the embedded profile,
 * identification in Info and XMP, trapping key and file identifier. Call after drawing and
 * before `savePdfx`. `date` is the document's date (a proof's own, or today).
 */
export function finishPdfx(doc: PDFDocument, target: PdfxTarget, meta: { title: string; date: Date; seed: string }): void {
	const { context, catalog } = doc;
	const { standard, profile } = target;
	const version = PDFX_VERSION[standard];

	// Info: title and dates (PDF/X wants both), the identification and trapping keys.
	doc.setTitle(meta.title);
	doc.setProducer('Paddock');
	doc.setCreator('Paddock');
	doc.setCreationDate(meta.date);
	doc.setModificationDate(meta.date);
	// setTitle above made sure the document has its information dictionary.
	const info = context.lookup(context.trailerInfo.Info, PDFDict);
	info.set(PDFName.of('GTS_PDFXVersion'), PDFString.of(version));
	if (standard === 'pdfx1a') info.set(PDFName.of('GTS_PDFXConformance'), PDFString.of(version));
	info.set(PDFName.of('Trapped'), PDFName.of('False'));

	// The output intent (ISO 32000-1 §14.11.5) with the condition's profile.
	const iccRef = context.register(
		context.stream(new Uint8Array(deflateSync(profile.icc)), { N: 4, Alternate: 'DeviceCMYK', Filter: 'FlateDecode' })
	);
	const intent = context.obj({
		Type: 'OutputIntent',
		S: 'GTS_PDFX',
		OutputConditionIdentifier: PDFString.of(profile.conditionIdentifier),
		OutputCondition: PDFString.of(profile.condition),
		Info: PDFString.of(profile.condition),
		...(profile.registryName ? { RegistryName: PDFString.of(profile.registryName) } : {}),
		DestOutputProfile: iccRef
	});
	catalog.set(PDFName.of('OutputIntents'), context.obj([intent]));

	// XMP (ISO 16684-1) mirroring the information dictionary, as PDF/X-4 requires; written for
	// PDF/X-1a too, where it is allowed and helps readers that look only at XMP.
	const date = xmpDate(meta.date);
	const documentId = uuidOf(`doc:${meta.seed}`);
	const xmp = `<?xpacket begin="\uFEFF" id="W5M0MpCehiHzreSzNTczkc9d"?>
<x:xmpmeta xmlns:x="adobe:ns:meta/">
 <rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#">
  <rdf:Description rdf:about=""
    xmlns:dc="http://purl.org/dc/elements/1.1/"
    xmlns:xmp="http://ns.adobe.com/xap/1.0/"
    xmlns:pdf="http://ns.adobe.com/pdf/1.3/"
    xmlns:xmpMM="http://ns.adobe.com/xap/1.0/mm/"
    xmlns:pdfxid="http://www.npes.org/pdfx/ns/id/"
    xmlns:pdfx="http://ns.adobe.com/pdfx/1.3/">
   <dc:format>application/pdf</dc:format>
   <dc:title><rdf:Alt><rdf:li xml:lang="x-default">${xmlText(meta.title)}</rdf:li></rdf:Alt></dc:title>
   <xmp:CreateDate>${date}</xmp:CreateDate>
   <xmp:ModifyDate>${date}</xmp:ModifyDate>
   <xmp:MetadataDate>${date}</xmp:MetadataDate>
   <xmp:CreatorTool>Paddock</xmp:CreatorTool>
   <pdf:Producer>Paddock</pdf:Producer>
   <pdf:Trapped>False</pdf:Trapped>
   <xmpMM:DocumentID>${documentId}</xmpMM:DocumentID>
   <xmpMM:InstanceID>${uuidOf(`instance:${meta.seed}`)}</xmpMM:InstanceID>
   <xmpMM:VersionID>1</xmpMM:VersionID>
   <xmpMM:RenditionClass>default</xmpMM:RenditionClass>
   <pdfxid:GTS_PDFXVersion>${version}</pdfxid:GTS_PDFXVersion>
${standard === 'pdfx1a' ? `   <pdfx:GTS_PDFXVersion>${version}</pdfx:GTS_PDFXVersion>\n   <pdfx:GTS_PDFXConformance>${version}</pdfx:GTS_PDFXConformance>\n` : ''}  </rdf:Description>
 </rdf:RDF>
</x:xmpmeta>
<?xpacket end="w"?>`;
	// Uncompressed, so tools that scan for XMP find it (ISO 32000-1 §14.3.2 recommends it).
	const metadata = context.register(context.stream(new TextEncoder().encode(xmp), { Type: 'Metadata', Subtype: 'XML' }));
	catalog.set(PDFName.of('Metadata'), metadata);

	// Every page says what is finished size and what is bleed (ISO 15930-7 §6.2.5): pages drawn
	// without them (an imposed sheet is its own finished size) get the whole page.
	for (const page of doc.getPages()) {
		const m = page.getMediaBox();
		if (!page.node.TrimBox()) page.setTrimBox(m.x, m.y, m.width, m.height);
		if (!page.node.BleedBox()) page.setBleedBox(m.x, m.y, m.width, m.height);
	}

	// The file identifier (ISO 32000-1 §14.4), required by PDF/X; from the document's identity, so the same input gives the same bytes.
	const id = createHash('md5').update(meta.seed).digest('hex');
	context.trailerInfo.ID = context.obj([PDFHexString.of(id), PDFHexString.of(id)]);
}
