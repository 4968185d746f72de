/**
 * Collects one face's display items and warnings, and checks at the end that everything that
 * carries meaning (text, symbols, tables, cells) lies inside the safe area.
 */
import type { Colour, DisplayItem, FaceLayout, TextItem } from '../display-list';
import type { MeasuringFonts } from '../typeface';
import { pathBounds } from '../symbols';
import { fitText, inkBoxUnits, ptToMm, type FitOptions, type FitResult, type TextBox } from '../text';
import type { FracBox } from './templates';

export type Box = TextBox;

export interface FaceGeometry {
	trimWidthMm: number;
	trimHeightMm: number;
	bleedMm: number;
	safeMm: number;
	cornerRadiusMm?: number;
}

/** Below this an overhang is rounding, not a layout fault. */
const SAFE_TOLERANCE_MM = 0.01;

export const hex = (h: string): Colour => ({ hex: h });

export class FaceBuilder {
	readonly items: DisplayItem[] = [];
	readonly warnings: string[] = [];
	private readonly content: { item: DisplayItem; what: string }[] = [];

	constructor(
		readonly fonts: MeasuringFonts,
		readonly geometry: FaceGeometry,
		/** Names the face in warnings, e.g. 'Movement “Pip 2” front'. */
		readonly context: string
	) {}

	/** The whole face, bleed included. */
	get face(): Box {
		const g = this.geometry;
		return { xMm: 0, yMm: 0, wMm: g.trimWidthMm + 2 * g.bleedMm, hMm: g.trimHeightMm + 2 * g.bleedMm };
	}

	get trim(): Box {
		const g = this.geometry;
		return { xMm: g.bleedMm, yMm: g.bleedMm, wMm: g.trimWidthMm, hMm: g.trimHeightMm };
	}

	get safe(): Box {
		const g = this.geometry;
		const i = g.bleedMm + g.safeMm;
		return { xMm: i, yMm: i, wMm: g.trimWidthMm - 2 * g.safeMm, hMm: g.trimHeightMm - 2 * g.safeMm };
	}

	/** A template box (fractions) placed in an area, the safe area unless given. */
	place(frac: FracBox, area: Box = this.safe): Box {
		return {
			xMm: area.xMm + frac.x * area.wMm,
			yMm: area.yMm + frac.y * area.hMm,
			wMm: frac.w * area.wMm,
			hMm: frac.h * area.hMm
		};
	}

	warn(message: string) {
		this.warnings.push(`${this.context}: ${message}`);
	}

	/** Decoration (backgrounds, bands, patterns) may run into the bleed. */
	decor(item: DisplayItem) {
		this.items.push(item);
	}

	/** Content must stay inside the safe area; `what` names it in a warning. */
	add(item: DisplayItem, what: string) {
		this.items.push(item);
		this.content.push({ item, what });
	}

	/** Fit text into a box (see fitText); a text that does not fit warns once, here. */
	text(text: string, box: Box, opts: FitOptions & { label: string }): FitResult {
		const result = fitText(this.fonts, text, box, { ...opts, label: undefined });
		if (result.warning) {
			this.warn(`${opts.label} ${result.warning}`);
			this.items.push(...result.items);
		} else for (const item of result.items) this.add(item, opts.label);
		return result;
	}

	private bounds(item: DisplayItem): { x0: number; y0: number; x1: number; y1: number } | undefined {
		switch (item.type) {
			case 'rect': {
				const s = (item.stroke ? (item.strokeMm ?? 0) : 0) / 2;
				return { x0: item.xMm - s, y0: item.yMm - s, x1: item.xMm + item.wMm + s, y1: item.yMm + item.hMm + s };
			}
			case 'ellipse': {
				const s = (item.stroke ? (item.strokeMm ?? 0) : 0) / 2;
				return {
					x0: item.cxMm - item.rxMm - s,
					y0: item.cyMm - item.ryMm - s,
					x1: item.cxMm + item.rxMm + s,
					y1: item.cyMm + item.ryMm + s
				};
			}
			case 'line':
				return {
					x0: Math.min(item.x1Mm, item.x2Mm),
					y0: Math.min(item.y1Mm, item.y2Mm),
					x1: Math.max(item.x1Mm, item.x2Mm),
					y1: Math.max(item.y1Mm, item.y2Mm)
				};
			case 'path':
				return pathBounds(item.d);
			case 'text':
				return this.inkBounds(item);
			case 'image': {
				const b = item.clip ?? item;
				return { x0: b.xMm, y0: b.yMm, x1: b.xMm + b.wMm, y1: b.yMm + b.hMm };
			}
		}
	}

	/** The glyphs' own outline box (not the line box), so big numerals are judged by their ink. */
	private inkBounds(item: TextItem) {
		const font = this.fonts[item.weight].metrics;
		const bbox = inkBoxUnits(font, item.text);
		const k = ptToMm(item.sizePt) / font.unitsPerEm;
		return {
			x0: item.xMm + bbox.minX * k,
			x1: item.xMm + bbox.maxX * k,
			y0: item.yMm - bbox.maxY * k,
			y1: item.yMm - bbox.minY * k
		};
	}

	finish(): FaceLayout {
		const s = this.safe;
		const reported = new Set<string>();
		for (const { item, what } of this.content) {
			const b = this.bounds(item);
			if (!b || reported.has(what)) continue;
			const out =
				b.x0 < s.xMm - SAFE_TOLERANCE_MM ||
				b.y0 < s.yMm - SAFE_TOLERANCE_MM ||
				b.x1 > s.xMm + s.wMm + SAFE_TOLERANCE_MM ||
				b.y1 > s.yMm + s.hMm + SAFE_TOLERANCE_MM;
			if (out) {
				reported.add(what);
				this.warn(`${what} reaches outside the safe area`);
			}
		}
		const g = this.geometry;
		return {
			trimWidthMm: g.trimWidthMm,
			trimHeightMm: g.trimHeightMm,
			bleedMm: g.bleedMm,
			safeMm: g.safeMm,
			cornerRadiusMm: g.cornerRadiusMm,
			items: this.items,
			warnings: this.warnings
		};
	}
}
