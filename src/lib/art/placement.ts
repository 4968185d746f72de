/**
 * Where art prints. The model names art slots but gives them no size: a slot's printed size is
 * whatever box the card layout draws it in. So each art asset is measured by laying out the
 * faces that show it (the same layout engine that makes the proofs and press files) and reading
 * the image's slot box in mm; its effective resolution there comes from ../game/art-check.ts.
 *
 * Also here: the places a game offers for art (runner, card kind or card × slot), for pickers.
 */
import type { FaceLayout, ImageAsset } from '../print/display-list';
import type { FontSet } from '../print/fonts';
import { layoutFace, type Side } from '../print/layout';
import { checkArtResolution, faceWithBleedMm, type ArtResolution, type SlotMm } from '../game/art-check';
import type { ArtAsset, ArtAssignment, Card, CardKind, Game } from '../game/model';
import { slotLabel, slotLabelIn } from '../game/art-slots';

/* ------------------------------------------------------------- places */

export interface ArtPlace {
	/** `scope targetId slot`: ids and slot names never hold a space, so this is unambiguous. */
	key: string;
	assignment: ArtAssignment;
	/** Heading of the group it is listed under (runners, card kinds, one kind's cards). */
	group: string;
	label: string;
}

export const placeKey = (a: ArtAssignment) => `${a.scope} ${a.targetId} ${a.slot}`;

export function parsePlaceKey(key: string): ArtAssignment | null {
	const [scope, targetId, slot, ...rest] = key.trim().split(' ');
	if (rest.length || !targetId || !slot || (scope !== 'runner' && scope !== 'kind' && scope !== 'card')) return null;
	return { scope, targetId, slot };
}

/** The slot a kind's shared back prints (it shows only the kind's own art, never a card's). */
const sharedBackSlot = (kind: CardKind) => (kind.back.mode === 'shared' ? kind.back.artSlot : undefined);

/** Slots that can differ from card to card: all but the shared back's. */
const perCardSlots = (kind: CardKind) => kind.artSlots.filter((s) => s !== sharedBackSlot(kind));

/**
 * Every place art can be assigned: each kind × its slots; each runner × the card slots of the
 * kinds whose cards show a runner (movement and wager cards; rogue cards for the rogue runner);
 * each card × its kind's per-card slots. Most specific wins when the card is drawn (card, then
 * runner, then kind: src/lib/print/layout/art.ts).
 */
export function artPlaces(game: Game): ArtPlace[] {
	const places: ArtPlace[] = [];
	const add = (assignment: ArtAssignment, group: string, label: string) =>
		places.push({ key: placeKey(assignment), assignment, group, label });

	const runnerSlots = (types: CardKind['type'][]) => [
		...new Set(game.kinds.filter((k) => types.includes(k.type)).flatMap(perCardSlots))
	];
	const raceSlots = runnerSlots(['movement', 'wager']);
	for (const r of game.runners)
		for (const slot of raceSlots) add({ scope: 'runner', targetId: r.id, slot }, 'Runners (every card of the runner)', `${r.name} · ${slotLabel(slot)}`);
	if (game.rogueRunner)
		for (const slot of runnerSlots(['rogue']))
			add({ scope: 'runner', targetId: game.rogueRunner.id, slot }, 'Runners (every card of the runner)', `${game.rogueRunner.name} (rogue) · ${slotLabel(slot)}`);

	for (const kind of game.kinds)
		for (const slot of kind.artSlots)
			add(
				{ scope: 'kind', targetId: kind.id, slot },
				'Card kinds (every card of the kind)',
				`${kind.name} · ${slotLabelIn(kind, slot)}`
			);

	for (const kind of game.kinds) {
		const slots = perCardSlots(kind);
		if (!slots.length) continue;
		for (const card of game.cards.filter((c) => c.kindId === kind.id))
			for (const slot of slots) add({ scope: 'card', targetId: card.id, slot }, `${kind.name}: one card`, `${card.name} · ${slotLabel(slot)}`);
	}
	return places;
}

/** Words for an assignment, also when its target has gone. */
export function describeAssignment(game: Game, a: ArtAssignment): string {
	if (a.scope === 'runner') {
		const r = game.runners.find((x) => x.id === a.targetId) ?? (game.rogueRunner?.id === a.targetId ? game.rogueRunner : undefined);
		return r ? `Runner ${r.name} · ${slotLabel(a.slot)}` : `a missing runner · ${slotLabel(a.slot)}`;
	}
	if (a.scope === 'kind') {
		const k = game.kinds.find((x) => x.id === a.targetId);
		return k ? `${k.name} · ${slotLabelIn(k, a.slot)}` : `a missing card kind · ${slotLabel(a.slot)}`;
	}
	const c = game.cards.find((x) => x.id === a.targetId);
	const k = c && game.kinds.find((x) => x.id === c.kindId);
	return c ? `${k ? `${k.name}: ` : ''}${c.name} · ${slotLabel(a.slot)}` : `a missing card · ${slotLabel(a.slot)}`;
}

/* ------------------------------------------------------- printed size */

export interface ArtPrintPlacement {
	kindId: string;
	kindName: string;
	/** Absent for a kind's shared back, which is the same for every card. */
	cardId?: string;
	cardName?: string;
	side: Side;
	/** The slot box the art is cover-fitted into and clipped to. */
	slotMm: SlotMm;
	resolution: ArtResolution;
}

export interface ArtPrintCheck {
	/**
	 * 'layout': measured where the layout draws it; 'face': the layout does not draw it (see
	 * `note`), so the card's face with bleed stands in; 'unplaced': not assigned to anything.
	 */
	basis: 'layout' | 'face' | 'unplaced';
	/** Faces that print it (shared backs count once per kind). */
	faces: number;
	/** The placement that prints softest (lowest effective dpi): the one to warn about. */
	worst?: ArtPrintPlacement;
	note?: string;
}

/**
 * Lays out every face of the game once and measures each art asset's slots. Images are stood in
 * by their sizes alone (no bytes are read) and keyed by art id, so each ImageItem the layout
 * places says which asset it is.
 */
export function artPrintChecks(game: Game, fonts: FontSet): Map<string, ArtPrintCheck> {
	const images = new Map<string, ImageAsset>();
	for (const a of game.art)
		images.set(a.id, { id: a.id, mime: 'image/png', bytes: new Uint8Array(), widthPx: a.widthPx, heightPx: a.heightPx });
	const art = new Map(game.art.map((a) => [a.id, a]));

	const found = new Map<string, ArtPrintPlacement[]>();
	const measure = (face: FaceLayout, kind: CardKind, card: Card | undefined, side: Side) => {
		for (const item of face.items) {
			if (item.type !== 'image') continue;
			const asset = art.get(item.imageId);
			if (!asset) continue;
			const box = item.clip ?? item;
			const slotMm = { widthMm: box.wMm, heightMm: box.hMm };
			const list = found.get(asset.id) ?? [];
			list.push({
				kindId: kind.id,
				kindName: kind.name,
				...(card && { cardId: card.id, cardName: card.name }),
				side,
				slotMm,
				resolution: checkArtResolution(asset, slotMm)
			});
			found.set(asset.id, list);
		}
	};
	for (const kind of game.kinds) {
		const cards = game.cards.filter((c) => c.kindId === kind.id);
		for (const card of cards) {
			measure(layoutFace({ game, kind, card, side: 'front', images, fonts }), kind, card, 'front');
			if (kind.back.mode === 'per-card') measure(layoutFace({ game, kind, card, side: 'back', images, fonts }), kind, card, 'back');
		}
		// A shared back shows only the kind's art and is the same on every card: lay it out once.
		if (kind.back.mode === 'shared' && kind.back.artSlot)
			measure(layoutFace({ game, kind, side: 'back', images, fonts }), kind, undefined, 'back');
	}

	const checks = new Map<string, ArtPrintCheck>();
	for (const asset of game.art) {
		const placements = found.get(asset.id);
		if (placements?.length) {
			const worst = placements.reduce((a, b) => (b.resolution.dpi < a.resolution.dpi ? b : a));
			checks.set(asset.id, { basis: 'layout', faces: placements.length, worst });
		} else checks.set(asset.id, unprinted(game, asset, found));
	}
	return checks;
}

/** Why the layout draws an asset nowhere, and the size it is checked against instead. */
function unprinted(game: Game, asset: ArtAsset, found: Map<string, ArtPrintPlacement[]>): ArtPrintCheck {
	const a = asset.assignment;
	if (!a) return { basis: 'unplaced', faces: 0, note: 'Not assigned to a slot yet, so it prints nowhere.' };
	const kind = kindFor(game, a);
	if (!kind) return { basis: 'unplaced', faces: 0, note: `Assigned to ${describeAssignment(game, a)}, which does not exist.` };

	const holder = game.art.find(
		(o) => o.id !== asset.id && o.assignment?.scope === a.scope && o.assignment.targetId === a.targetId && o.assignment.slot === a.slot
	);
	// The layout takes the first asset assigned to a slot (src/lib/print/layout/art.ts).
	const shadowed = holder && game.art.indexOf(holder) < game.art.indexOf(asset);
	const holderWorst = shadowed ? found.get(holder.id)?.reduce((x, y) => (y.resolution.dpi < x.resolution.dpi ? y : x)) : undefined;
	const side: Side = a.slot === sharedBackSlot(kind) ? 'back' : 'front';
	const slotMm = holderWorst?.slotMm ?? faceWithBleedMm(kind.size, kind.bleed);
	const note = shadowed
		? `“${holder.fileName}” holds this slot, so this art does not print; checked against that slot's size.`
		: !kind.artSlots.includes(a.slot)
			? `${kind.name} has no slot “${a.slot}”; checked against the whole face with bleed.`
			: !game.cards.some((c) => c.kindId === kind.id) && side === 'front'
				? `${kind.name} has no cards yet; checked against the whole face with bleed.`
				: `The layout of ${kind.name} does not draw slot “${a.slot}”; checked against the whole face with bleed.`;
	return {
		basis: holderWorst ? 'layout' : 'face',
		faces: 0,
		worst: {
			kindId: kind.id,
			kindName: kind.name,
			side,
			slotMm,
			resolution: checkArtResolution(asset, slotMm)
		},
		note
	};
}

/** The kind whose cards an assignment prints on (for a runner: the first kind that shows it). */
function kindFor(game: Game, a: ArtAssignment): CardKind | undefined {
	if (a.scope === 'kind') return game.kinds.find((k) => k.id === a.targetId);
	if (a.scope === 'card') {
		const card = game.cards.find((c) => c.id === a.targetId);
		return card && game.kinds.find((k) => k.id === card.kindId);
	}
	const rogue = game.rogueRunner?.id === a.targetId;
	if (!rogue && !game.runners.some((r) => r.id === a.targetId)) return undefined;
	const shows = (c: Card) =>
		rogue ? c.data.type === 'rogue' : (c.data.type === 'movement' || c.data.type === 'wager') && c.data.runnerId === a.targetId;
	const kinds = game.kinds.filter((k) => game.cards.some((c) => c.kindId === k.id && shows(c)));
	return kinds.find((k) => k.artSlots.includes(a.slot)) ?? kinds[0] ?? game.kinds.find((k) => k.type === (rogue ? 'rogue' : 'movement'));
}
