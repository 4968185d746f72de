/**
 * Text measuring, wrapping and fitting with the font's own metrics.
 *
 * Every text run on a card is measured here once, so the SVG and PDF backends only place
 * glyphs at the positions computed below and never re-flow them.
 */
import type { Colour, FontWeight, TextItem } from './display-list';
import type { MeasuringFont, MeasuringFonts as FontSet } from './typeface';
import { MM_PER_INCH } from '../game/model';
import { PT_PER_INCH } from './paper';

type FontMetrics = MeasuringFont['metrics'];

/** 1 pt = 1/72 in (PostScript point, as used by PDF: ISO 32000-1 §8.3.2.3). */
export const MM_PER_PT = MM_PER_INCH / PT_PER_INCH;

export const ptToMm = (pt: number) => pt * MM_PER_PT;

/** A box in face millimetres (top-left origin, y down). */
export interface TextBox {
	xMm: number;
	yMm: number;
	wMm: number;
	hMm: number;
}

// Advance widths and ink boxes in font units do not depend on the size, so one cache serves every size tried.
interface Measured {
	units: number;
	/** The glyphs' outline box, asked for by the safe-area check only (so filled in on first ask). */
	ink?: InkBox;
}
/** A box in font units, y up (fontkit's bbox). */
export interface InkBox {
	minX: number;
	minY: number;
	maxX: number;
	maxY: number;
}
const unitCache = new WeakMap<FontMetrics, Map<string, Measured>>();
/** Texts measured per font before the cache starts over (a long-lived server sees ever new names). */
const MAX_MEASURED_TEXTS = 20_000;

function measured(font: FontMetrics, text: string): Measured {
	let cache = unitCache.get(font);
	if (!cache) {
		cache = new Map();
		unitCache.set(font, cache);
	}
	let entry = cache.get(text);
	if (entry === undefined) {
		entry = { units: text === '' ? 0 : ASCII_WORDS.test(text) ? wordUnits(font, text) : font.layout(text).advanceWidth };
		if (cache.size >= MAX_MEASURED_TEXTS) cache.clear();
		cache.set(text, entry);
	}
	return entry;
}

/** Printable ASCII words with one space between them. */
const ASCII_WORDS = /^[!-~]+(?: [!-~]+)+$/;

/**
 * Such a text's width is its words' and spaces' widths: the shipped typeface shapes nothing
 * across a space between printable ASCII characters (no kerning pair or ligature spans one:
 * checked pair by pair in ./pdf-fontkit.test.ts; the sheet label relies on it too), and font-unit
 * advances are whole numbers, so the sum equals the shaped line's width exactly. Wrapping tries
 * a line with one word more at each step: this way each word is shaped once, not every line.
 */
function wordUnits(font: FontMetrics, text: string): number {
	const words = text.split(' ');
	let units = (words.length - 1) * measured(font, ' ').units;
	for (const word of words) units += measured(font, word).units;
	return units;
}

const advanceUnits = (font: FontMetrics, text: string): number => measured(font, text).units;

/** The outline box of `text`'s shaped glyphs, in font units: shaped once per text, not once per face. */
export function inkBoxUnits(font: FontMetrics, text: string): InkBox {
	const entry = measured(font, text);
	if (!entry.ink) {
		const { minX, minY, maxX, maxY } = font.layout(text).bbox;
		entry.ink = { minX, minY, maxX, maxY };
	}
	return entry.ink;
}

/** Width of `text` set in `font` at `sizePt`, in mm (shaped advance width, kerning included). */
export function measureTextMm(font: FontMetrics, text: string, sizePt: number): number {
	return (advanceUnits(font, text) / font.unitsPerEm) * sizePt * MM_PER_PT;
}

/** Ascent above and descent below the baseline (both positive), in mm, from the font's hhea metrics. */
export function verticalMetricsMm(font: FontMetrics, sizePt: number) {
	const em = sizePt * MM_PER_PT;
	return {
		ascentMm: (font.ascent / font.unitsPerEm) * em,
		descentMm: (-font.descent / font.unitsPerEm) * em,
		capHeightMm: (font.capHeight / font.unitsPerEm) * em
	};
}

export interface WrapResult {
	lines: string[];
	/** A word wider than the line had to be cut between letters. */
	brokeWord: boolean;
}

/**
 * Break `text` into lines no wider than `widthMm`, at spaces; a word wider than a whole line is
 * cut between letters only when `hardBreak` is set (otherwise it is left on its own, too wide).
 * Newlines in the text start a new line.
 */
export function wrapText(
	font: FontMetrics,
	text: string,
	sizePt: number,
	widthMm: number,
	hardBreak = true
): WrapResult {
	const fits = (s: string) => measureTextMm(font, s, sizePt) <= widthMm + 1e-9;
	const lines: string[] = [];
	let brokeWord = false;
	for (const paragraph of text.split(/\r?\n/)) {
		const words = paragraph.split(/\s+/).filter((w) => w !== '');
		if (words.length === 0) {
			lines.push('');
			continue;
		}
		let line = '';
		for (let word of words) {
			const candidate = line === '' ? word : `${line} ${word}`;
			if (fits(candidate)) {
				line = candidate;
				continue;
			}
			if (line !== '') lines.push(line);
			line = '';
			if (!fits(word) && hardBreak) {
				brokeWord = true;
				// Cut the word at the longest prefix that fits (at least one character per line).
				while (!fits(word)) {
					const chars = Array.from(word);
					let n = 1;
					while (n < chars.length && fits(chars.slice(0, n + 1).join(''))) n++;
					lines.push(chars.slice(0, n).join(''));
					word = chars.slice(n).join('');
				}
			}
			line = word;
		}
		lines.push(line);
	}
	return { lines, brokeWord };
}

export type HAlign = 'left' | 'center' | 'right';
export type VAlign = 'top' | 'middle' | 'bottom';

export interface FitOptions {
	maxPt: number;
	minPt: number;
	/** Size decrement between tries; 0.5 pt unless given. */
	stepPt?: number;
	weight?: FontWeight;
	align?: HAlign;
	valign?: VAlign;
	/** Baseline-to-baseline distance as a multiple of the size. */
	lineHeight?: number;
	fill: Colour;
	/** Allow more than one line (default true). */
	wrap?: boolean;
	maxLines?: number;
	/** When even minPt does not fit, cut the text and end it with an ellipsis (still warns). */
	ellipsis?: boolean;
	/** Names the text in warnings, e.g. 'movement card "Slick": name'. */
	label?: string;
}

export interface FitResult {
	items: TextItem[];
	sizePt: number;
	lines: string[];
	/** Height of the set block, first line's ascent to last line's descent. */
	heightMm: number;
	/** Widest line. */
	widthMm: number;
	/** Set when the text does not fit the box even at minPt (it overflows or was cut). */
	warning?: string;
}

const ELLIPSIS = '\u2026';

function blockHeightMm(font: FontMetrics, sizePt: number, lineCount: number, lineHeight: number) {
	const { ascentMm, descentMm } = verticalMetricsMm(font, sizePt);
	return ascentMm + descentMm + Math.max(0, lineCount - 1) * lineHeight * ptToMm(sizePt);
}

function linesFitBox(
	font: FontMetrics,
	lines: string[],
	sizePt: number,
	box: TextBox,
	lineHeight: number
) {
	return (
		lines.every((l) => measureTextMm(font, l, sizePt) <= box.wMm + 1e-9) &&
		blockHeightMm(font, sizePt, lines.length, lineHeight) <= box.hMm + 1e-9
	);
}

/** Longest prefix of `line` that fits `widthMm` with an ellipsis after it. */
function withEllipsis(font: FontMetrics, line: string, sizePt: number, widthMm: number): string {
	const chars = Array.from(line.trimEnd());
	for (let n = chars.length; n >= 0; n--) {
		const s = chars.slice(0, n).join('').trimEnd() + ELLIPSIS;
		if (measureTextMm(font, s, sizePt) <= widthMm) return s;
	}
	return ELLIPSIS;
}

const fmtMm = (mm: number) => `${Math.round(mm * 10) / 10}`;

/**
 * Set `text` inside `box`: start at maxPt and shrink by stepPt until the text fits (wrapping at
 * spaces when allowed), down to minPt. Words are only cut between letters, the text only
 * ellipsised (if allowed), when nothing fits; then the result carries a warning.
 */
export function fitText(fonts: FontSet, text: string, box: TextBox, opts: FitOptions): FitResult {
	const weight = opts.weight ?? 'regular';
	const font = fonts[weight].metrics;
	const lineHeight = opts.lineHeight ?? 1.2;
	const step = opts.stepPt ?? 0.5;
	const wrap = opts.wrap ?? true;
	const maxLines = wrap ? (opts.maxLines ?? Infinity) : 1;
	const clean = wrap ? text.trim() : text.replace(/\s+/g, ' ').trim();

	const linesAt = (sizePt: number, hardBreak: boolean): WrapResult =>
		wrap
			? wrapText(font, clean, sizePt, box.wMm, hardBreak)
			: { lines: [clean], brokeWord: false };

	let chosen: { sizePt: number; lines: string[] } | undefined;
	const sizes: number[] = [];
	for (let s = opts.maxPt; s > opts.minPt + 1e-9; s -= step) sizes.push(Math.round(s * 100) / 100);
	sizes.push(opts.minPt);
	for (const sizePt of sizes) {
		const { lines } = linesAt(sizePt, false);
		if (lines.length <= maxLines && linesFitBox(font, lines, sizePt, box, lineHeight)) {
			chosen = { sizePt, lines };
			break;
		}
	}

	let warning: string | undefined;
	if (!chosen) {
		const sizePt = opts.minPt;
		let { lines } = linesAt(sizePt, true);
		// As many lines as the box (and maxLines) hold, at least one.
		let room = 1;
		while (
			room < Math.min(lines.length, maxLines) &&
			blockHeightMm(font, sizePt, room + 1, lineHeight) <= box.hMm + 1e-9
		)
			room++;
		const what = `${opts.label ? `${opts.label}: ` : ''}"${clean.length > 40 ? clean.slice(0, 40) + ELLIPSIS : clean}"`;
		const where = `${fmtMm(box.wMm)} × ${fmtMm(box.hMm)} mm at ${sizePt} pt`;
		const fitsNow = lines.length <= room && linesFitBox(font, lines, sizePt, box, lineHeight);
		if (fitsNow) {
			warning = `${what} fits ${where} only by breaking a word`;
		} else if (opts.ellipsis) {
			const kept = lines.slice(0, room);
			const last = kept.length - 1;
			const cut = lines.length > room || measureTextMm(font, kept[last], sizePt) > box.wMm;
			if (cut) kept[last] = withEllipsis(font, kept[last], sizePt, box.wMm);
			lines = kept;
			warning = cut
				? `${what} does not fit ${where}; cut short with an ellipsis`
				: `${what} does not fit ${where}; it overflows its box`;
		} else {
			warning = `${what} does not fit ${where}; it overflows its box`;
		}
		chosen = { sizePt, lines };
	}

	const { sizePt, lines } = chosen;
	const { ascentMm } = verticalMetricsMm(font, sizePt);
	const leadingMm = lineHeight * ptToMm(sizePt);
	const heightMm = blockHeightMm(font, sizePt, lines.length, lineHeight);
	const valign = opts.valign ?? 'top';
	const topMm =
		valign === 'top'
			? box.yMm
			: valign === 'bottom'
				? box.yMm + box.hMm - heightMm
				: box.yMm + (box.hMm - heightMm) / 2;
	const align = opts.align ?? 'left';
	let widest = 0;
	const items: TextItem[] = [];
	lines.forEach((line, i) => {
		const widthMm = measureTextMm(font, line, sizePt);
		widest = Math.max(widest, widthMm);
		if (line === '') return;
		const xMm =
			align === 'left'
				? box.xMm
				: align === 'right'
					? box.xMm + box.wMm - widthMm
					: box.xMm + (box.wMm - widthMm) / 2;
		items.push({
			type: 'text',
			xMm,
			yMm: topMm + ascentMm + i * leadingMm,
			text: line,
			sizePt,
			weight,
			fill: opts.fill,
			widthMm
		});
	});
	return { items, sizePt, lines, heightMm, widthMm: widest, warning };
}

/** One line at a fixed size, no fitting: for labels the layout has already sized. */
export function textLine(
	fonts: FontSet,
	text: string,
	at: { xMm: number; baselineMm: number; align?: HAlign },
	sizePt: number,
	weight: FontWeight,
	fill: Colour
): TextItem {
	const widthMm = measureTextMm(fonts[weight].metrics, text, sizePt);
	const align = at.align ?? 'left';
	const xMm = align === 'left' ? at.xMm : align === 'right' ? at.xMm - widthMm : at.xMm - widthMm / 2;
	return { type: 'text', xMm, yMm: at.baselineMm, text, sizePt, weight, fill, widthMm };
}

/**
 * Fit a title on as few lines as possible: one line if it fits there at no less than
 * `minShare` of maxPt, else two, and so on up to `maxLines`; failing all, the best that fits
 * (or the warning of the last try). Short names stay on one line instead of breaking early.
 */
export function fitTitle(
	fonts: FontSet,
	text: string,
	box: TextBox,
	opts: FitOptions & { maxLines: number },
	minShare = 0.7
): FitResult {
	let best: FitResult | undefined;
	let last: FitResult | undefined;
	for (let lines = 1; lines <= opts.maxLines; lines++) {
		last = fitText(fonts, text, box, { ...opts, maxLines: lines });
		if (last.warning) continue;
		if (last.sizePt >= minShare * opts.maxPt) return last;
		if (!best || last.sizePt > best.sizePt) best = last;
	}
	return best ?? last!;
}
