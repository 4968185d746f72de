/**
 * The plan of an imposed sheet PDF, before anything is drawn: which card goes in which slot of
 * which page. Cards of one size (trim and bleed) share sheets; each size gets its own. With
 * duplex, each back is placed behind its own front (see ./duplex.ts); the fold layout puts
 * fronts and backs on one page instead. ./sheets.ts draws the plan, ./cutting-guide.ts and
 * ./preview.ts read it.
 */
import type { FaceLayout } from './display-list';
import { backSlots, type BackOffsetMm, type DuplexMode } from './duplex';
import { impose, type ImposeLayout, type Imposition, type Orientation, type Slot } from './impose';
import { CROP_MARK } from './marks';
import { paperSize, type PaperSpec } from './paper';
import type { ColourMode } from './pdf';

export interface SheetFace {
	kindKey: string;
	front: FaceLayout;
	/** The card's own back (track tiles differ per tile) or a kind's shared back. */
	back?: FaceLayout;
	copies: number;
}

export interface SheetOptions {
	paper: PaperSpec;
	marginMm: number;
	layout: ImposeLayout;
	/** 'none' prints fronts only (except in the fold layout, which has its backs on the front page). */
	duplex: DuplexMode;
	marks: boolean;
	/** How many complete sets of the cards to print. */
	sets: number;
	backOffsetMm?: BackOffsetMm;
	colour: ColourMode;
	cuttingGuide: boolean;
	orientation?: Orientation | 'auto';
	gutterMm?: number;
}

export interface PlacedCard {
	slot: Slot;
	face: FaceLayout;
	kindKey: string;
}

export interface PlannedPage {
	side: 'front' | 'back';
	/** 1-based physical sheet number across the whole document. */
	sheet: number;
	cards: PlacedCard[];
}

export interface SheetGroup {
	trimWidthMm: number;
	trimHeightMm: number;
	bleedMm: number;
	kindKeys: string[];
	imposition: Imposition;
	cardCount: number;
	pages: PlannedPage[];
}

export interface SheetPlan {
	groups: SheetGroup[];
	sheetCount: number;
	warnings: string[];
}

/** Pages of a sheet document: the card pages of the plan, then the cutting guide when it is included. */
export interface PageCount {
	cardPages: number;
	guidePages: number;
	total: number;
}

/** The one page count of a build: the preview, the builder and the finished job all say this figure. */
export function countPages(plan: Pick<SheetPlan, 'groups'>, cuttingGuide: boolean): PageCount {
	const cardPages = plan.groups.reduce((n, g) => n + g.pages.length, 0);
	const guidePages = cuttingGuide ? 1 : 0;
	return { cardPages, guidePages, total: cardPages + guidePages };
}

/** Crop marks want this much room outside the bleed; kept free only when it costs no cards. */
const MARK_ROOM_MM = CROP_MARK.gapMm + CROP_MARK.lengthMm;

export function planSheets(input: { faces: SheetFace[]; options: SheetOptions }): SheetPlan {
	const o = input.options;
	const paper = paperSize(o.paper);
	const sets = Math.max(1, Math.floor(o.sets || 1));
	const warnings: string[] = [];

	// Group card instances by size, keeping first-seen order; sets repeat the whole deck.
	const bySize = new Map<string, { faces: SheetFace[]; front: FaceLayout }>();
	for (const f of input.faces) {
		if (f.back && (f.back.trimWidthMm !== f.front.trimWidthMm || f.back.trimHeightMm !== f.front.trimHeightMm))
			throw new Error(`the back of "${f.kindKey}" is not the size of its front`);
		const key = `${f.front.trimWidthMm}×${f.front.trimHeightMm}+${f.front.bleedMm}`;
		if (!bySize.has(key)) bySize.set(key, { faces: [], front: f.front });
		bySize.get(key)!.faces.push(f);
	}

	const groups: SheetGroup[] = [];
	let sheet = 0;
	for (const { faces, front } of bySize.values()) {
		const instances: SheetFace[] = [];
		for (let s = 0; s < sets; s++) for (const f of faces) for (let c = 0; c < Math.max(0, f.copies); c++) instances.push(f);
		if (!instances.length) continue;
		const base = {
			sheet: paper,
			marginMm: o.marginMm,
			trimWidthMm: front.trimWidthMm,
			trimHeightMm: front.trimHeightMm,
			bleedMm: front.bleedMm,
			layout: o.layout,
			orientation: o.orientation ?? 'auto',
			gutterMm: o.gutterMm
		};
		const tight = impose(base);
		if (!tight.ok) throw new Error(`${faces.map((f) => f.kindKey).join(', ')}: ${tight.error}`);
		const roomy = o.marks ? impose({ ...base, markSpaceMm: MARK_ROOM_MM }) : tight;
		const imp = roomy.ok && roomy.cardsPerSheet >= tight.cardsPerSheet ? roomy : tight;

		const fold = o.layout === 'fold';
		const duplex = !fold && o.duplex !== 'none';
		const fronts = imp.slots.filter((s) => s.side === 'front');
		const foldBacks = imp.slots.filter((s) => s.side === 'back');
		const backs = duplex ? backSlots(imp, o.duplex as 'long' | 'short', o.backOffsetMm) : [];
		const frontIndex = new Map(imp.slots.map((s, i) => [s, i]));
		const pages: PlannedPage[] = [];
		for (let at = 0; at < instances.length; at += fronts.length) {
			const chunk = instances.slice(at, at + fronts.length);
			sheet++;
			const front: PlannedPage = { side: 'front', sheet, cards: [] };
			const back: PlannedPage = { side: 'back', sheet, cards: [] };
			chunk.forEach((f, i) => {
				front.cards.push({ slot: fronts[i], face: f.front, kindKey: f.kindKey });
				if (f.back && fold) front.cards.push({ slot: foldBacks[i], face: f.back, kindKey: f.kindKey });
				if (f.back && duplex) back.cards.push({ slot: backs[frontIndex.get(fronts[i])!], face: f.back, kindKey: f.kindKey });
			});
			pages.push(front);
			if (back.cards.length) pages.push(back);
		}
		if (o.duplex === 'none' && !fold && faces.some((f) => f.back))
			warnings.push(`backs of ${faces.map((f) => f.kindKey).join(', ')} are not printed without duplex`);
		groups.push({
			trimWidthMm: front.trimWidthMm,
			trimHeightMm: front.trimHeightMm,
			bleedMm: front.bleedMm,
			kindKeys: [...new Set(faces.map((f) => f.kindKey))],
			imposition: imp,
			cardCount: instances.length,
			pages
		});
	}
	return { groups, sheetCount: sheet, warnings };
}
