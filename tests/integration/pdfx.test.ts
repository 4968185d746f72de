/**
 * PDF/X through the app's routes, for the working game and for a released proof alike, read back
 * by qpdf and poppler; and a printer's own ICC profile, checked on the way in.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openWorld, statusOf, type World, actorIn } from './harness';
import { as, g, game } from './role-table';
import { cutProof, releaseProof } from '$lib/server/proofs';
import { saveProfile, setPressProfile, findProfile } from '$lib/server/printer-profiles';
import { DEFAULT_PROFILE } from '$lib/schemas/printing';
import { BUILTIN_PRESS_PROFILE_FILE } from '$lib/print/colour/press-profiles';
import { checkPdfx } from '$lib/print/testing/pdfx-check';
import * as gamePdf from '../../src/routes/api/v1/games/[gameId=id]/print.pdf/+server';
import * as gamePress from '../../src/routes/api/v1/games/[gameId=id]/cards/[cardId]/press.pdf/+server';
import * as proofPdf from '../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/print.pdf/+server';
import * as proofPress from '../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/cards/[cardId]/press.pdf/+server';

let w: World;
let proofId: string;
let cardId: string;
let setupKind: string;

beforeAll(async () => {
	w = await openWorld();
	const designer = w.callers.designer!;
	const p = await cutProof(w.db, actorIn(w, 'designer'), { description: 'for the press' });
	proofId = (await releaseProof(w.db, actorIn(w, 'designer'), { proof: p })).id;
	const gm = await game(w);
	cardId = gm.cards[0].id;
	setupKind = gm.kinds.find((k) => k.type === 'setup')!.id;
});
afterAll(async () => w?.close());

const bytesOf = async (r: Response) => new Uint8Array(await r.arrayBuffer());

describe('PDF/X routes', () => {
	it('press.pdf?output=pdfx4 of the working game: PDF/X-4 with the built-in FOGRA39 profile', async () => {
		const res = await gamePress.GET(as(w, 'designer', { params: g(w, { cardId }), path: '/?output=pdfx4' }));
		const r = checkPdfx(await bytesOf(res));
		expect(r.qpdfCheck.status).toBe(0);
		expect(r.info.GTS_PDFXVersion).toBe('PDF/X-4');
		expect(r.outputIntents[0]['/OutputConditionIdentifier']).toBe('u:FOGRA39');
		expect(r.imageColours).not.toContain('rgb');
		expect(r.fonts.every((f) => f.emb && f.sub)).toBe(true);
	});

	it('a released proof: press.pdf and print.pdf with output=pdfx4 for the printer', async () => {
		const press = await proofPress.GET(as(w, 'printer', { params: g(w, { proofId, cardId }), path: '/?output=pdfx4' }));
		expect(checkPdfx(await bytesOf(press)).info.GTS_PDFXVersion).toBe('PDF/X-4');
		const sheets = await proofPdf.GET(as(w, 'printer', { params: g(w, { proofId }), path: `/?output=pdfx4&layout=butted&kinds=${setupKind}` }));
		const r = checkPdfx(await bytesOf(sheets));
		expect(r.info.GTS_PDFXVersion).toBe('PDF/X-4');
		expect(r.pages.every((p) => p.trimBox && p.bleedBox)).toBe(true);
	});

	it('print.pdf?output=pdfx1a of the working game', async () => {
		const res = await gamePdf.GET(as(w, 'designer', { params: g(w), path: `/?output=pdfx1a&kinds=${setupKind}` }));
		const r = checkPdfx(await bytesOf(res));
		expect(r.info.GTS_PDFXVersion).toBe('PDF/X-1a:2003');
		expect(r.pdfVersion).toBe('1.4');
	});

	it('refuses an unknown output or intent with a clear 400', async () => {
		expect(await statusOf(() => gamePress.GET(as(w, 'designer', { params: g(w, { cardId }), path: '/?output=pdfx3' })))).toBe(400);
		expect(await statusOf(() => gamePdf.GET(as(w, 'designer', { params: g(w), path: '/?output=pdfx4&intent=vivid' })))).toBe(400);
		expect(await statusOf(() => gamePress.GET(as(w, 'designer', { params: g(w, { cardId }), path: '/?output=pdfx4&profile=nope' })))).toBe(404);
	});

	it("a printer's own profile: checked on upload, then named by profile= in the output intent", async () => {
		const printer = w.callers.printer!;
		const profile = await saveProfile(w.db, actorIn(w, 'printer'), { ...DEFAULT_PROFILE, name: 'Shop on coated', output: 'pdfx4' });
		// Not an ICC profile; an RGB display profile: refused, nothing stored.
		await expect(setPressProfile(w.db, actorIn(w, 'printer'), { id: profile.id, icc: new Uint8Array(500), condition: { conditionIdentifier: 'X', condition: '', registryName: '', totalInkLimitPct: 300 } })).rejects.toThrow(/not an ICC profile|too short/);
		// An sRGB display profile made outside the project (Debian's icc-profiles-free; scripts/preflight.js installs it).
		const srgb = new Uint8Array(readFileSync('/usr/share/color/icc/sRGB.icc'));
		await expect(setPressProfile(w.db, actorIn(w, 'printer'), { id: profile.id, icc: srgb, condition: { conditionIdentifier: 'X', condition: '', registryName: '', totalInkLimitPct: 300 } })).rejects.toThrow(/display profile|RGB/);
		expect((await findProfile(w.db, w.teamId, profile.id)).press.custom).toBe(false);

		const icc = new Uint8Array(readFileSync(BUILTIN_PRESS_PROFILE_FILE));
		const saved = await setPressProfile(w.db, actorIn(w, 'printer'), { id: profile.id, icc: icc, condition: { conditionIdentifier: 'SHOP-COATED-1', condition: 'The shop’s own coated stock', registryName: '', totalInkLimitPct: 310 } });
		expect(saved.press).toMatchObject({ custom: true, conditionIdentifier: 'SHOP-COATED-1', totalInkLimitPct: 310 });
		const res = await proofPress.GET(as(w, 'printer', { params: g(w, { proofId, cardId }), path: `/?output=pdfx4&profile=${profile.id}` }));
		const r = checkPdfx(await bytesOf(res));
		expect(r.outputIntents[0]['/OutputConditionIdentifier']).toBe('u:SHOP-COATED-1');
		expect(r.outputIntents[0]['/RegistryName']).toBeUndefined();
		// Another team cannot name it.
		const other = await statusOf(() => proofPress.GET(as(w, 'outsider', { params: g(w, { proofId, cardId }), path: `/?output=pdfx4&profile=${profile.id}` })));
		expect(other).toBe(404);
	});
});
