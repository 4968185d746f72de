/**
 * Soft proofs through the app's routes: a PNG of the face with bleed, the figures in headers or
 * JSON, the press profile chosen by `profile=` or the game's default, bad choices refused.
 */
import { readFileSync } from 'node:fs';
import { Jimp } from 'jimp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openWorld, statusOf, type World, actorIn } from './harness';
import { as, g, game } from './role-table';
import { saveProfile, setPressProfile } from '$lib/server/printer-profiles';
import { DEFAULT_PROFILE } from '$lib/schemas/printing';
import { BUILTIN_PRESS_PROFILE_FILE } from '$lib/print/colour/press-profiles';
import { GAMUT_WARNING_DELTA_E2000 } from '$lib/print/colour/delta-e';
import * as gameSoftProof from '../../src/routes/api/v1/games/[gameId=id]/cards/[cardId]/soft-proof.png/+server';
import * as previewSoftProof from '../../src/routes/api/v1/games/[gameId=id]/preview/soft-proof/+server';
import { games } from '$lib/server/db/schema';
import { eq } from 'drizzle-orm';

let w: World;
let cardId: string;

beforeAll(async () => {
	w = await openWorld();
	cardId = (await game(w)).cards[0].id;
});
afterAll(async () => w?.close());

describe('soft proof routes', () => {
	it('soft-proof.png: a PNG face with the built-in condition and the ΔE2000 threshold in headers', async () => {
		const res = await gameSoftProof.GET(as(w, 'reviewer', { params: g(w, { cardId }) }));
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('image/png');
		expect(res.headers.get('x-paddock-press-condition')).toBe('FOGRA39');
		expect(Number(res.headers.get('x-paddock-delta-e2000-threshold'))).toBe(GAMUT_WARNING_DELTA_E2000);
		const moved = Number(res.headers.get('x-paddock-moved-pct'));
		expect(moved).toBeGreaterThanOrEqual(0);
		expect(moved).toBeLessThanOrEqual(100);
		const img = await Jimp.read(Buffer.from(await res.arrayBuffer()));
		expect(img.width).toBeGreaterThan(100);
	});

	it('refuses a bad side, intent or threshold with a clear message, and another team’s profile id', async () => {
		for (const [q, text] of [
			['?side=edge', 'side'],
			['?intent=saturation', 'intent'],
			['?deltaE=0.2', 'deltaE'],
			['?deltaE=abc', 'deltaE']
		]) {
			const res = await gameSoftProof.GET(as(w, 'designer', { params: g(w, { cardId }), path: '/' + q }));
			expect(res.status, q).toBe(400);
			expect((await res.json()).error.message, q).toContain(text);
		}
		expect(await statusOf(() => gameSoftProof.GET(as(w, 'designer', { params: g(w, { cardId }), path: '/?profile=00000000-0000-4000-8000-000000000000' })))).toBe(404);
		expect(await statusOf(() => gameSoftProof.GET(as(w, 'designer', { params: g(w, { cardId: 'no-such-card' }) })))).toBe(404);
	});

	it('uses the game’s default press profile when none is named, and a named one over it', async () => {
		const designer = w.callers.designer!;
		const shop = await saveProfile(w.db, actorIn(w, 'designer'), { ...DEFAULT_PROFILE, name: 'Soft proof shop' });
		const icc = new Uint8Array(readFileSync(BUILTIN_PRESS_PROFILE_FILE));
		await setPressProfile(w.db, actorIn(w, 'designer'), { id: shop.id, icc: icc, condition: { conditionIdentifier: 'SHOP-COATED', condition: 'The shop’s coated stock', registryName: '', totalInkLimitPct: 320 } });
		await w.db.update(games).set({ pressProfileId: shop.id }).where(eq(games.id, w.gameId));
		try {
			const byDefault = await gameSoftProof.GET(as(w, 'designer', { params: g(w, { cardId }) }));
			expect(byDefault.headers.get('x-paddock-press-condition')).toBe('SHOP-COATED');
			const other = await saveProfile(w.db, actorIn(w, 'designer'), { ...DEFAULT_PROFILE, name: 'Soft proof built-in' });
			const named = await gameSoftProof.GET(as(w, 'designer', { params: g(w, { cardId }), path: `/?profile=${other.id}` }));
			expect(named.headers.get('x-paddock-press-condition')).toBe('FOGRA39');
		} finally {
			await w.db.update(games).set({ pressProfileId: null }).where(eq(games.id, w.gameId));
		}
	});

	it('preview/soft-proof: the editor’s unsaved card as JSON with a PNG data URL and the figures', async () => {
		const gm = await game(w);
		const card = { ...gm.cards[0], name: 'Renamed but not saved' };
		const kind = gm.kinds.find((k) => k.id === card.kindId)!;
		const res = await previewSoftProof.POST(as(w, 'designer', { params: g(w), json: { kind, card, side: 'back', deltaE: 5, marks: false } }));
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.png).toMatch(/^data:image\/png;base64,/);
		expect(body).toMatchObject({ thresholdDeltaE2000: 5, conditionIdentifier: 'FOGRA39' });
		expect(body.widthPx).toBeGreaterThan(100);
	});
});
