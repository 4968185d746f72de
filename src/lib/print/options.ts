/**
 * Print settings: how a sheet PDF is asked for, described once.
 *
 * - `PrintSettingsSchema`: the settings as typed values, with their units and limits. A printer
 *   profile stores these (plus its name), and the print page's fields are these.
 * - `settingsQuery`: settings → the print routes' query parameters (a profile, the print page).
 * - `PrintQuerySchema` / `parsePrintOptions`: query parameters (or the CLI's flags), as they arrive
 *   as strings → `PrintOptions`, the options the engine's builders take.
 *
 * A new setting goes into all three here, and nowhere else.
 */
import { z } from 'zod';
import type { BackOffsetMm, DuplexMode } from './duplex';
import type { ImposeLayout } from './impose';
import { paperSize, type PaperName, type PaperSpec } from './paper';
import type { ColourMode } from './pdf';
import type { SheetOptions } from './sheet-plan';
import { RENDERING_INTENTS, type RenderingIntent } from './colour/cmm';

/* ---------------------------------------------------------------- errors */

/** A request the engine refuses as asked (bad or impossible options); `status` is the HTTP answer. */
export class PrintOptionsError extends Error {
	constructor(
		message: string,
		readonly status = 400
	) {
		super(message);
		this.name = 'PrintOptionsError';
	}
}

/* ------------------------------------------------------- units and limits */

/** Sides of a custom sheet, mm: from a postcard to a large-format roll width (our own bounds). */
export const CUSTOM_PAPER_MIN_MM = 50;
export const CUSTOM_PAPER_MAX_MM = 1500;
export const SETS_MAX = 50;
export const MARGIN_MAX_MM = 50;
/** Office printers are often off by 1–2 mm; the calibration sheet reads up to 10 (see ./calibration.ts). */
export const BACK_OFFSET_MAX_MM = 10;
/**
 * Unprintable border assumed when none is given. Office printers commonly need 3–6 mm (common
 * practice, from memory); the printer profile should say.
 */
export const DEFAULT_MARGIN_MM = 5;

export const PAPER_NAMES = ['a4', 'a3', 'letter', 'tabloid'] as const satisfies readonly PaperName[];
export const LAYOUTS = ['spaced', 'butted', 'fold'] as const satisfies readonly ImposeLayout[];
export const DUPLEX_MODES = ['none', 'long', 'short'] as const satisfies readonly DuplexMode[];
export const COLOUR_MODES = ['rgb', 'cmyk'] as const satisfies readonly ColourMode[];
/**
 * What kind of file: `plain` is an ordinary PDF in `colour` (home and office printers take any
 * PDF); `pdfx4` and `pdfx1a` are the exchange files a print shop asks for (ISO 15930, ./pdfx.ts),
 * in the CMYK of a press profile.
 */
export const OUTPUTS = ['plain', 'pdfx4', 'pdfx1a'] as const;
export type Output = (typeof OUTPUTS)[number];
export { RENDERING_INTENTS };

/** “a, b or c”, for messages. */
const either = (values: readonly string[]) => `${values.slice(0, -1).join(', ')} or ${values.at(-1)}`;
const choice = <const T extends readonly [string, ...string[]]>(name: string, values: T) =>
	z.enum(values, { error: `${name} is ${either(values)}` });

/* -------------------------------------------------------- typed settings */

const customSideMm = z
	.number()
	.min(CUSTOM_PAPER_MIN_MM, `Custom paper sides are ${CUSTOM_PAPER_MIN_MM}–${CUSTOM_PAPER_MAX_MM} mm`)
	.max(CUSTOM_PAPER_MAX_MM, `Custom paper sides are ${CUSTOM_PAPER_MIN_MM}–${CUSTOM_PAPER_MAX_MM} mm`);
const backOffsetMm = z
	.number()
	.min(-BACK_OFFSET_MAX_MM, `The back offset is at most ${BACK_OFFSET_MAX_MM} mm either way`)
	.max(BACK_OFFSET_MAX_MM, `The back offset is at most ${BACK_OFFSET_MAX_MM} mm either way`);

/** How one printer takes sheets, as typed values (custom paper sides only with paper 'custom'). */
export const PrintSettingsSchema = z.object({
	paper: choice('paper', [...PAPER_NAMES, 'custom']),
	customWidthMm: customSideMm.optional(),
	customHeightMm: customSideMm.optional(),
	/** What the printer cannot reach at the sheet's edges. */
	marginMm: z.number().min(0, 'The margin cannot be negative').max(MARGIN_MAX_MM, `The margin is at most ${MARGIN_MAX_MM} mm`),
	layout: choice('layout', LAYOUTS),
	marks: z.boolean(),
	duplex: choice('duplex', DUPLEX_MODES),
	/** Read off the calibration sheet: how far the back lands right (+x) and below (+y) of the front. */
	backOffsetXMm: backOffsetMm,
	backOffsetYMm: backOffsetMm,
	colour: choice('colour', COLOUR_MODES),
	output: choice('output', OUTPUTS).default('plain'),
	/** How RGB art goes into the press profile's CMYK (PDF/X only): relative colorimetric with black-point compensation, or perceptual. */
	intent: choice('intent', RENDERING_INTENTS).default('relative')
});
export type PrintSettings = z.infer<typeof PrintSettingsSchema>;

/** The settings as the print routes' query parameters. */
export function settingsQuery(s: PrintSettings): Record<string, string> {
	return {
		paper: s.paper === 'custom' ? `custom:${s.customWidthMm}x${s.customHeightMm}` : s.paper,
		margin: String(s.marginMm),
		layout: s.layout,
		marks: s.marks ? '1' : '0',
		duplex: s.duplex,
		backX: String(s.backOffsetXMm),
		backY: String(s.backOffsetYMm),
		colour: s.colour,
		output: s.output,
		intent: s.intent
	};
}

/* ------------------------------------------------------ query parameters */

/** 'a4' | 'a3' | 'letter' | 'tabloid' | 'custom:<w>x<h>' (mm), case-insensitive. */
export function parsePaper(text: string): PaperSpec {
	const v = text.trim().toLowerCase();
	if ((PAPER_NAMES as readonly string[]).includes(v)) return v as PaperName;
	const m = /^custom:(\d+(?:\.\d+)?)x(\d+(?:\.\d+)?)$/.exec(v);
	if (!m) throw new PrintOptionsError(`Unknown paper “${text}”: use ${PAPER_NAMES.join(', ')} or custom:<width>x<height> in mm`);
	const [w, h] = [Number(m[1]), Number(m[2])];
	for (const side of [w, h])
		if (!customSideMm.safeParse(side).success)
			throw new PrintOptionsError(`Custom paper sides must be ${CUSTOM_PAPER_MIN_MM}–${CUSTOM_PAPER_MAX_MM} mm, not ${side} mm`);
	return { widthMm: w, heightMm: h };
}

/** Query-string booleans: 1/0, true/false, yes/no, on/off; a bare `?marks` counts as yes. */
const Boolish = z
	.union([z.boolean(), z.string().trim().toLowerCase()])
	.transform((v, ctx) => {
		if (typeof v === 'boolean') return v;
		if (['', '1', 'true', 'yes', 'on'].includes(v)) return true;
		if (['0', 'false', 'no', 'off'].includes(v)) return false;
		ctx.addIssue({ code: 'custom', message: `“${v}” is not yes or no` });
		return z.NEVER;
	});

const Paper = z.string().transform((v, ctx) => {
	try {
		return parsePaper(v);
	} catch (e) {
		ctx.addIssue({ code: 'custom', message: (e as Error).message });
		return z.NEVER;
	}
});

const mm = (max: number, what: string) =>
	z.coerce
		.number({ error: `${what} must be a number of mm` })
		.min(-max, `${what} is at most ${max} mm either way`)
		.max(max, `${what} is at most ${max} mm either way`);

/** The query parameters of a sheet PDF request (also the CLI's flags), as they arrive: strings. */
export const PrintQuerySchema = z.object({
	paper: Paper.default('a4'),
	layout: PrintSettingsSchema.shape.layout.default('spaced'),
	duplex: PrintSettingsSchema.shape.duplex.default('none'),
	marks: Boolish.default(true),
	sets: z.coerce
		.number({ error: 'sets must be a whole number' })
		.int('sets must be a whole number')
		.min(1, `sets is 1 to ${SETS_MAX}`)
		.max(SETS_MAX, `sets is 1 to ${SETS_MAX}`)
		.default(1),
	margin: z.coerce
		.number({ error: 'margin must be a number of mm' })
		.min(0, 'margin cannot be negative')
		.max(MARGIN_MAX_MM, `margin is at most ${MARGIN_MAX_MM} mm`)
		.default(DEFAULT_MARGIN_MM),
	colour: PrintSettingsSchema.shape.colour.default('rgb'),
	output: PrintSettingsSchema.shape.output,
	intent: PrintSettingsSchema.shape.intent,
	guide: Boolish.default(true),
	/** Card kind ids, comma-separated; all kinds when absent. */
	kinds: z
		.string()
		.transform((v) =>
			v
				.split(',')
				.map((s) => s.trim())
				.filter(Boolean)
		)
		.optional(),
	backX: mm(BACK_OFFSET_MAX_MM, 'backX').default(0),
	backY: mm(BACK_OFFSET_MAX_MM, 'backY').default(0)
});
export type PrintQuery = z.input<typeof PrintQuerySchema>;

/** What to print and how: the options every sheet PDF builder takes. */
export interface PrintOptions {
	paper: PaperSpec;
	marginMm?: number;
	layout: ImposeLayout;
	duplex: DuplexMode;
	marks: boolean;
	sets: number;
	/** The printer's back-side error read from the calibration sheet (see ./duplex.ts). */
	backOffsetMm?: { x: number; y: number };
	colour: ColourMode;
	/** Plain PDF or PDF/X (the press profile comes with the request, see ./pdfx.ts). */
	output?: Output;
	intent?: RenderingIntent;
	cuttingGuide?: boolean;
	/** Card kind ids to print; all when absent. */
	kinds?: string[];
}

/** The query parsed into the options `buildGamePdf` takes. */
export const PrintOptionsSchema = PrintQuerySchema.transform(
	(q): PrintOptions => ({
		paper: q.paper,
		marginMm: q.margin,
		layout: q.layout,
		duplex: q.duplex,
		marks: q.marks,
		sets: q.sets,
		colour: q.colour,
		output: q.output,
		intent: q.intent,
		cuttingGuide: q.guide,
		kinds: q.kinds,
		backOffsetMm: { x: q.backX, y: q.backY }
	})
);

/** Parse query parameters (URLSearchParams or a plain record); throws PrintOptionsError with every reason. */
export function parsePrintOptions(query: URLSearchParams | Record<string, string | undefined>): PrintOptions {
	const raw = query instanceof URLSearchParams ? Object.fromEntries(query) : query;
	const parsed = PrintOptionsSchema.safeParse(raw);
	if (!parsed.success)
		throw new PrintOptionsError(
			parsed.error.issues
				.map((i) => {
					const where = i.path.join('.');
					// Most messages name their parameter already.
					return !where || i.message.toLowerCase().includes(where.toLowerCase()) ? i.message : `${where}: ${i.message}`;
				})
				.join('; ')
		);
	return parsed.data;
}

/* ----------------------------------------------------- options, checked */

/** Options built in code (the CLI, a worker) get the same limits as parsed ones. */
export function checkPrintOptions(o: PrintOptions): void {
	if (!Number.isInteger(o.sets) || o.sets < 1 || o.sets > SETS_MAX) throw new PrintOptionsError(`sets is 1 to ${SETS_MAX}`);
	const margin = o.marginMm ?? DEFAULT_MARGIN_MM;
	if (!(margin >= 0 && margin <= MARGIN_MAX_MM)) throw new PrintOptionsError(`margin is 0 to ${MARGIN_MAX_MM} mm`);
	for (const v of [o.backOffsetMm?.x ?? 0, o.backOffsetMm?.y ?? 0])
		if (!(Math.abs(v) <= BACK_OFFSET_MAX_MM)) throw new PrintOptionsError(`the back offset is at most ${BACK_OFFSET_MAX_MM} mm either way`);
	for (const [name, value, values] of [
		['layout', o.layout, LAYOUTS],
		['duplex', o.duplex, DUPLEX_MODES],
		['colour', o.colour, COLOUR_MODES],
		['output', o.output ?? 'plain', OUTPUTS],
		['intent', o.intent ?? 'relative', RENDERING_INTENTS]
	] as const)
		if (!(values as readonly string[]).includes(value)) throw new PrintOptionsError(`${name} is ${either(values)}`);
	paperSize(o.paper);
}

/** The sheet module's options for a print request (the defaults filled in). */
export function toSheetOptions(options: PrintOptions): SheetOptions {
	const offset: BackOffsetMm | undefined = options.backOffsetMm ? { xMm: options.backOffsetMm.x, yMm: options.backOffsetMm.y } : undefined;
	return {
		paper: options.paper,
		marginMm: options.marginMm ?? DEFAULT_MARGIN_MM,
		layout: options.layout,
		duplex: options.duplex,
		marks: options.marks,
		sets: options.sets,
		backOffsetMm: offset,
		colour: options.colour,
		cuttingGuide: options.cuttingGuide ?? true
	};
}
