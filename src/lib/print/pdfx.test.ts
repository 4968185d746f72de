/**
 * PDF/X files of the demo game, read back by qpdf and poppler (./testing/pdfx-check.ts):
 * what ISO 15930-7 (PDF/X-4) and ISO 15930-4 (PDF/X-1a:2003) ask of an exchange file.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { demoGameWithArt } from '../demo/demo-art';
import type { Game } from '../game/model';
import { builtinPressProfile } from './colour/press-profiles';
import type { PressProfile } from './colour/cmm';
import { buildCardPressPdf } from './press-job';
import { buildGamePdf } from './sheet-job';
import { parsePrintOptions } from './options';
import { checkPdfx, type PdfxReport } from './testing/pdfx-check';
import { PrintCache } from './cache';

let game: Game;
let art: Map<string, Uint8Array>;
let profile: PressProfile;

beforeAll(async () => {
	({ game, art } = await demoGameWithArt());
	profile = await builtinPressProfile();
});

/** What every PDF/X file must show, whichever version. */
function expectPdfx(r: PdfxReport, version: string) {
	// qpdf --check: no syntax or stream errors, no warnings.
	expect(r.qpdfCheck).toEqual({ status: 0, warnings: [] });
	// Output intent (ISO 32000-1 §14.11.5, ISO 15930-7 §6.2.4): GTS_PDFX, the condition, the profile with N 4.
	expect(r.outputIntents).toHaveLength(1);
	const oi = r.outputIntents[0];
	expect(oi['/S']).toBe('/GTS_PDFX');
	expect(oi['/OutputConditionIdentifier']).toBe('u:FOGRA39');
	expect(r.destOutputProfile?.dict['/N']).toBe(4);
	// The embedded ICC profile's header (ICC.1:2010 §7.2), read from the bytes qpdf decoded.
	expect(r.destOutputProfile).toMatchObject({ signature: 'acsp', deviceClass: 'prtr', colourSpace: 'CMYK', pcs: 'Lab ' });
	expect(r.destOutputProfile!.declaredSize).toBe(r.destOutputProfile!.bytes);
	// Identification and trapping keys in the document information (ISO 15930-7 §6.2.2, §6.2.3).
	expect(r.info.GTS_PDFXVersion).toBe(version);
	expect(r.info.Trapped).toBe('/False');
	expect(r.info.Title).toBeTruthy();
	expect(r.info.CreationDate).toMatch(/^D:\d{14}/);
	expect(r.trailerId).toBe(true);
	// XMP carries the same identification (pdfxid namespace, ISO 15930-7 §6.2.2).
	expect(r.xmp).toContain(`<pdfxid:GTS_PDFXVersion>${version}</pdfxid:GTS_PDFXVersion>`);
	expect(r.xmp).toContain('xmlns:pdfxid="http://www.npes.org/pdfx/ns/id/"');
	expect(r.xmp).toContain('<pdf:Trapped>False</pdf:Trapped>');
	// TrimBox and BleedBox on every page, TrimBox ⊆ BleedBox ⊆ MediaBox (ISO 32000-1 §14.11.2).
	for (const p of r.pages) {
		expect(p.trimBox).toHaveLength(4);
		expect(p.bleedBox).toHaveLength(4);
		const [tx0, ty0, tx1, ty1] = p.trimBox!;
		const [bx0, by0, bx1, by1] = p.bleedBox!;
		const [mx0, my0, mx1, my1] = p.mediaBox;
		expect(bx0 <= tx0 + 1e-6 && by0 <= ty0 + 1e-6 && bx1 >= tx1 - 1e-6 && by1 >= ty1 - 1e-6).toBe(true);
		expect(mx0 <= bx0 + 1e-6 && my0 <= by0 + 1e-6 && mx1 >= bx1 - 1e-6 && my1 >= by1 - 1e-6).toBe(true);
	}
	// pdfimages: no RGB picture; pdffonts: every font embedded and subset.
	expect(r.imageColours.length).toBeGreaterThan(0);
	expect(r.imageColours.filter((c) => c === 'rgb')).toEqual([]);
	expect(r.fonts.length).toBeGreaterThan(0);
	for (const f of r.fonts) {
		expect(f, f.name).toMatchObject({ emb: true, sub: true });
		expect(f.name).toMatch(/^[A-Z]{6}\+/);
	}
	// poppler renders it: the first page has ink on it.
	expect(r.inkedShare).toBeGreaterThan(0.2);
}

describe('PDF/X press files', () => {
	it('PDF/X-4: one card with art, checked by qpdf and poppler', async () => {
		const card = game.cards[0];
		const { pdf } = await buildCardPressPdf(game, art, card.id, { pdfx: { standard: 'pdfx4', profile, intent: 'relative' }, date: '2026-03-01' });
		const r = checkPdfx(pdf);
		expectPdfx(r, 'PDF/X-4');
		expect(r.pdfVersion).toBe('1.6');
		expect(r.pages).toHaveLength(2);
		// No DeviceRGB anywhere: not as an image colour space, not as an operator (rg/RG) in content.
		expect(Buffer.from(pdf).includes('DeviceRGB')).toBe(false);
	});

	it('PDF/X-1a:2003: PDF 1.4 without object streams, and the same checks', async () => {
		const card = game.cards[0];
		const { pdf } = await buildCardPressPdf(game, art, card.id, { pdfx: { standard: 'pdfx1a', profile, intent: 'perceptual' }, date: '2026-03-01' });
		const r = checkPdfx(pdf);
		expectPdfx(r, 'PDF/X-1a:2003');
		expect(r.pdfVersion).toBe('1.4');
		expect(r.info.GTS_PDFXConformance).toBe('PDF/X-1a:2003');
		expect(Buffer.from(pdf).includes('/ObjStm')).toBe(false);
		expect(Buffer.from(pdf).includes('/SMask')).toBe(false);
	});

	it('PDF/X-4 sheets: every page boxed, no RGB, and the same bytes twice', async () => {
		const kind = game.kinds.find((k) => k.type === 'movement')!;
		const options = { ...parsePrintOptions({ paper: 'a4', duplex: 'long', kinds: kind.id }), pdfx: { standard: 'pdfx4' as const, profile, intent: 'relative' as const }, date: '2026-03-01' };
		const a = await buildGamePdf(game, art, { ...options, cache: new PrintCache() });
		const r = checkPdfx(a.pdf);
		expectPdfx(r, 'PDF/X-4');
		expect(r.pages.length).toBe(a.pages);
		const b = await buildGamePdf(game, art, { ...options, cache: new PrintCache() });
		expect(Buffer.from(b.pdf).equals(Buffer.from(a.pdf))).toBe(true);
	});

	it('plain RGB files for home printers stay as they were: no output intent, RGB pictures', async () => {
		const { pdf } = await buildCardPressPdf(game, art, game.cards[0].id, { colour: 'rgb' });
		const r = checkPdfx(pdf);
		expect(r.outputIntents).toEqual([]);
		expect(r.info.GTS_PDFXVersion).toBeUndefined();
		expect(r.imageColours).toContain('rgb');
	});

	it('total ink: a runner CMYK over the profile limit is named in a warning', async () => {
		const heavy: Game = structuredClone(game);
		heavy.runners[0].cmyk = { c: 100, m: 100, y: 100, k: 100 };
		const card = heavy.cards.find((c) => c.kindId === heavy.kinds.find((k) => k.type === 'movement')!.id)!;
		const { warnings } = await buildCardPressPdf(heavy, art, card.id, { pdfx: { standard: 'pdfx4', profile, intent: 'relative' } });
		expect(warnings.some((w) => /400 % total ink, over the 330 % limit of FOGRA39/.test(w))).toBe(true);
	});
});
