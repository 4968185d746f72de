import { beforeAll, describe, expect, it } from 'vitest';
import { artPlaces, artPrintChecks, describeAssignment, parsePlaceKey, placeKey } from './placement';
import { loadFonts, type FontSet } from '../print/fonts';
import { testGame } from '../print/layout/test-game';
import type { ArtAsset, ArtAssignment, Game } from '../game/model';

let fonts: FontSet;
beforeAll(async () => {
	fonts = await loadFonts();
});

const asset = (id: string, widthPx: number, heightPx: number, assignment: ArtAssignment | null, mime: ArtAsset['mime'] = 'image/png'): ArtAsset => ({
	id,
	sha256: id.padEnd(64, '0').replace(/[^0-9a-f]/g, 'a').slice(0, 64),
	mime,
	widthPx,
	heightPx,
	status: 'sketch',
	fileName: `${id}.png`,
	assignment
});

/** The test game (US bleed, poker cards) with a back art slot on its setup cards and a portrait slot on movement cards. */
function game(art: ArtAsset[]): Game {
	const g = testGame();
	g.kinds = g.kinds.map((k) =>
		k.id === 'k-setup'
			? { ...k, back: { mode: 'shared', template: 'back', params: {}, artSlot: 'backArt' }, artSlots: ['backArt'] }
			: k.id === 'k-move'
				? { ...k, artSlots: ['portrait'] }
				: k
	);
	return { ...g, art };
}

describe('printed size from the card layout', () => {
	it('back art on a poker card with 1/8 in bleed needs 825 × 1125 px for 300 dpi (product brief)', () => {
		// Poker 2.5 × 3.5 in plus 1/8 in bleed per side (common practice) = 2.75 × 3.75 in
		// = 69.85 × 95.25 mm; × 300 dpi = 825 × 1125 px.
		const backArt: ArtAssignment = { scope: 'kind', targetId: 'k-setup', slot: 'backArt' };
		const checks = artPrintChecks(game([asset('exact', 825, 1125, backArt)]), fonts);
		const c = checks.get('exact')!;
		expect(c.basis).toBe('layout');
		expect(c.worst!.side).toBe('back');
		expect(c.worst!.slotMm.widthMm).toBeCloseTo(69.85, 9);
		expect(c.worst!.slotMm.heightMm).toBeCloseTo(95.25, 9);
		expect(c.worst!.resolution.dpi).toBeCloseTo(300, 9);
		expect(c.worst!.resolution.ok).toBe(true);

		const short = artPrintChecks(game([asset('short', 824, 1125, backArt)]), fonts).get('short')!;
		expect(short.worst!.resolution.ok).toBe(false);
		expect(short.worst!.resolution.dpi).toBeCloseTo(824 / 2.75, 6);
	});

	it('a runner portrait is measured in the movement layout, inside the safe area', () => {
		const portrait: ArtAssignment = { scope: 'runner', targetId: 'r-bramble', slot: 'portrait' };
		const c = artPrintChecks(game([asset('bramble', 600, 400, portrait)]), fonts).get('bramble')!;
		expect(c.basis).toBe('layout');
		expect(c.faces).toBe(1); // the test game has one Bramble movement card
		expect(c.worst!.cardId).toBe('mv-bramble-2');
		// The US safe area is the trim less 1/8 in per side (common practice): 57.15 × 82.55 mm;
		// the slot sits inside it, so it is smaller than the face.
		expect(c.worst!.slotMm.widthMm).toBeLessThanOrEqual(57.15 + 1e-9);
		expect(c.worst!.slotMm.heightMm).toBeLessThan(82.55);
		expect(c.worst!.resolution.dpi).toBeCloseTo(Math.min(600 / (c.worst!.slotMm.widthMm / 25.4), 400 / (c.worst!.slotMm.heightMm / 25.4)), 9);
	});

	it("a card's own art wins over its runner's; the runner's then prints on the other cards only", () => {
		const g = game([
			asset('runner-art', 600, 400, { scope: 'runner', targetId: 'r-saffron', slot: 'portrait' }),
			asset('card-art', 600, 400, { scope: 'card', targetId: 'mv-saffron-3', slot: 'portrait' })
		]);
		const checks = artPrintChecks(g, fonts);
		expect(checks.get('card-art')!.faces).toBe(1);
		// Saffron has one movement card (taken by the card's own art) and wager cards without a portrait slot.
		expect(checks.get('runner-art')!.faces).toBe(0);
	});

	it('the second piece on a taken slot does not print and is checked against that slot', () => {
		const backArt: ArtAssignment = { scope: 'kind', targetId: 'k-setup', slot: 'backArt' };
		const checks = artPrintChecks(game([asset('first', 825, 1125, backArt), asset('second', 300, 400, backArt)]), fonts);
		const second = checks.get('second')!;
		expect(second.faces).toBe(0);
		expect(second.note).toMatch(/“first\.png” holds this slot/);
		expect(second.worst!.slotMm.widthMm).toBeCloseTo(69.85, 9);
		expect(second.worst!.resolution.ok).toBe(false);
	});

	it('falls back to the face with bleed where the layout draws no such slot, and says so', () => {
		const c = artPrintChecks(game([asset('aid', 100, 100, { scope: 'kind', targetId: 'k-aid', slot: 'picture' })]), fonts).get('aid')!;
		expect(c.basis).toBe('face');
		expect(c.note).toMatch(/Player aids has no slot “picture”/);
		expect(c.worst!.slotMm).toEqual({ widthMm: 63.5 + 6.35, heightMm: 88.9 + 6.35 });
	});

	it('unassigned art prints nowhere; vector art is never too coarse', () => {
		const checks = artPrintChecks(
			game([asset('loose', 10, 10, null), asset('vector', 10, 10, { scope: 'kind', targetId: 'k-setup', slot: 'backArt' }, 'image/svg+xml')]),
			fonts
		);
		expect(checks.get('loose')).toMatchObject({ basis: 'unplaced', faces: 0 });
		expect(checks.get('vector')!.worst!.resolution.ok).toBe(true);
	});
});

describe('places for art', () => {
	it('offers runners, kinds and cards, but never a shared back per card', () => {
		const g = game([]);
		const keys = artPlaces(g).map((p) => p.key);
		expect(keys).toContain('runner r-bramble portrait');
		expect(keys).toContain('kind k-setup backArt');
		expect(keys).toContain('card mv-long portrait');
		expect(keys).not.toContain('card st-4 backArt');
		expect(keys.filter((k) => k.startsWith('runner r-gravel'))).toEqual([]); // rogue cards have no art slot here
	});

	it('round-trips its keys and refuses others', () => {
		const a: ArtAssignment = { scope: 'card', targetId: 'kd-hazard.hz-bootprint', slot: 'icon' };
		expect(parsePlaceKey(placeKey(a))).toEqual(a);
		expect(parsePlaceKey('everything k-1 icon')).toBeNull();
		expect(parsePlaceKey('kind k-1')).toBeNull();
		expect(parsePlaceKey('kind k-1 icon extra')).toBeNull();
	});

	it('names what an assignment points at, or that it is missing', () => {
		const g = game([]);
		expect(describeAssignment(g, { scope: 'runner', targetId: 'r-gravel', slot: 'portrait' })).toBe('Runner Gravel · Main picture');
		expect(describeAssignment(g, { scope: 'card', targetId: 'mv-long', slot: 'portrait' })).toBe('Crawl cards: Periwinkle 2 · Main picture');
		expect(describeAssignment(g, { scope: 'kind', targetId: 'k-gone', slot: 'x' })).toBe('a missing card kind · X');
	});
});
