/**
 * The game's default press profile, chosen on the settings page: PDF/X files of the working game
 * and of a proof use it when no printer profile is named (read back by qpdf: the output intent's
 * condition), a named profile still wins, and bad or foreign choices are refused.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openWorld, type World, actorIn } from './harness';
import { as, g, game } from './role-table';
import { cutProof, releaseProof } from '$lib/server/proofs';
import { saveProfile, setPressProfile } from '$lib/server/printer-profiles';
import { DEFAULT_PROFILE } from '$lib/schemas/printing';
import { BUILTIN_PRESS_PROFILE_FILE } from '$lib/print/colour/press-profiles';
import { checkPdfx } from '$lib/print/testing/pdfx-check';
import * as settingsPage from '../../src/routes/(app)/games/[gameId=id]/settings/+page.server';
import * as gamePress from '../../src/routes/api/v1/games/[gameId=id]/cards/[cardId]/press.pdf/+server';
import * as proofPress from '../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/cards/[cardId]/press.pdf/+server';

let w: World;
let cardId: string;
let shopId: string;
let plainId: string;

beforeAll(async () => {
	w = await openWorld();
	cardId = (await game(w)).cards[0].id;
	const designer = w.callers.designer!;
	const shop = await saveProfile(w.db, actorIn(w, 'designer'), { ...DEFAULT_PROFILE, name: 'Corner shop', output: 'pdfx4' });
	const icc = new Uint8Array(readFileSync(BUILTIN_PRESS_PROFILE_FILE));
	await setPressProfile(w.db, actorIn(w, 'designer'), { id: shop.id, icc: icc, condition: { conditionIdentifier: 'CORNER-COATED', condition: 'The corner shop’s coated stock', registryName: '', totalInkLimitPct: 320 } });
	shopId = shop.id;
	plainId = (await saveProfile(w.db, actorIn(w, 'designer'), { ...DEFAULT_PROFILE, name: 'Built-in press' })).id;
});
afterAll(async () => w?.close());

const conditionOf = async (res: Response) => {
	expect(res.status).toBe(200);
	const r = checkPdfx(new Uint8Array(await res.arrayBuffer()));
	return String(r.outputIntents[0]['/OutputConditionIdentifier']).replace(/^u:/, '');
};
const choose = (profile: string, who: 'designer' | 'owner' = 'designer') => settingsPage.actions.press(as(w, who, { params: g(w), form: { profile } }));

describe('the game’s default press profile', () => {
	it('starts as the built-in FOGRA39, shown on the settings page', async () => {
		const page = await settingsPage.load(as(w, 'reviewer', { params: g(w) }));
		expect(page.press.conditionIdentifier).toBe('FOGRA39');
		expect(page.mayEdit).toBe(false);
		expect(page.profiles.map((p) => p.id)).toEqual(expect.arrayContaining([shopId, plainId]));
		expect(await conditionOf(await gamePress.GET(as(w, 'designer', { params: g(w, { cardId }), path: '/?output=pdfx4' })))).toBe('FOGRA39');
	});

	it('chosen by a designer, PDF/X files of the working game and of proofs use it; a named profile wins', async () => {
		const answer = await choose(shopId);
		expect(answer).toMatchObject({ saved: expect.stringContaining('CORNER-COATED') });
		const page = await settingsPage.load(as(w, 'designer', { params: g(w) }));
		expect(page).toMatchObject({ pressProfileId: shopId, mayEdit: true, press: { conditionIdentifier: 'CORNER-COATED', printerProfile: 'Corner shop' } });

		expect(await conditionOf(await gamePress.GET(as(w, 'designer', { params: g(w, { cardId }), path: '/?output=pdfx4' })))).toBe('CORNER-COATED');
		const d = w.callers.designer!;
		const p = await cutProof(w.db, actorIn(w, 'designer'), { description: 'default press' });
		const proofId = (await releaseProof(w.db, actorIn(w, 'designer'), { proof: p })).id;
		expect(await conditionOf(await proofPress.GET(as(w, 'printer', { params: g(w, { proofId, cardId }), path: '/?output=pdfx4' })))).toBe('CORNER-COATED');
		expect(await conditionOf(await gamePress.GET(as(w, 'designer', { params: g(w, { cardId }), path: `/?output=pdfx4&profile=${plainId}` })))).toBe('FOGRA39');
	});

	it('back to the built-in profile with an empty choice', async () => {
		await choose('', 'owner');
		expect((await settingsPage.load(as(w, 'designer', { params: g(w) }))).pressProfileId).toBeNull();
		expect(await conditionOf(await gamePress.GET(as(w, 'designer', { params: g(w, { cardId }), path: '/?output=pdfx4' })))).toBe('FOGRA39');
	});

	it('refuses what is not one of the team’s printer profiles, and keeps the choice', async () => {
		await choose(shopId);
		const bad = await choose('not-a-profile');
		expect(bad).toMatchObject({ status: 400, data: { error: expect.stringContaining('printer profiles') } });
		const foreign = await choose('00000000-0000-4000-8000-000000000000');
		expect(foreign).toMatchObject({ status: 404 });
		expect((await settingsPage.load(as(w, 'designer', { params: g(w) }))).pressProfileId).toBe(shopId);
	});

	it('a deleted printer profile leaves the game on the built-in profile', async () => {
		const { deleteProfile } = await import('$lib/server/printer-profiles');
		await deleteProfile(w.db, actorIn(w, 'designer'), { id: shopId });
		const page = await settingsPage.load(as(w, 'designer', { params: g(w) }));
		expect(page.pressProfileId).toBeNull();
		expect(page.press.conditionIdentifier).toBe('FOGRA39');
	});
});
