/** Printer profiles: how one printer (at home or a shop) takes sheets. Shared by form, API and print page. */
import { z } from 'zod';
import { DEFAULT_MARGIN_MM, PrintSettingsSchema } from '$lib/print/options';
import { RENDERING_INTENTS } from '$lib/print/colour/cmm';
import { GAMUT_WARNING_DELTA_E2000, GAMUT_WARNING_MAX, GAMUT_WARNING_MIN } from '$lib/print/colour/delta-e';

/** A printer's settings (./print/options.ts holds their units and limits), named and versioned. */
export const PrinterProfileSchema = z
	.strictObject({
		id: z.string().uuid().optional(),
		name: z.string().trim().min(1, 'Name the profile').max(60),
		...PrintSettingsSchema.shape,
		version: z.int().min(0).optional()
	})
	.refine((p) => p.paper !== 'custom' || (p.customWidthMm && p.customHeightMm), {
		message: 'Give the custom paper its width and height in mm',
		path: ['customWidthMm']
	});

export type PrinterProfile = z.infer<typeof PrinterProfileSchema>;

export const DEFAULT_PROFILE: PrinterProfile = {
	name: 'Home printer',
	paper: 'a4',
	marginMm: DEFAULT_MARGIN_MM,
	layout: 'spaced',
	marks: true,
	duplex: 'long',
	backOffsetXMm: 0,
	backOffsetYMm: 0,
	colour: 'rgb',
	output: 'plain',
	intent: 'relative'
};

/** Ink limit assumed for an uploaded profile until the printer says: the low end of common practice for coated stock (300–330 %). */
export const DEFAULT_INK_LIMIT_PCT = 300;

/**
 * The printing condition that goes with an uploaded ICC profile, as PDF/X names it: the
 * identifier the print shop confirms (e.g. FOGRA51, GRACoL2013), words for people, where the
 * identifier is registered, and the condition's total ink limit.
 */
export const PressConditionSchema = z.strictObject({
	conditionIdentifier: z
		.string()
		.trim()
		.min(1, 'Name the printing condition (ask the print shop, e.g. FOGRA39)')
		.max(60)
		.regex(/^[\x20-\x7e]+$/, 'The condition identifier is plain ASCII letters, digits and signs'),
	condition: z.string().trim().max(200).default(''),
	registryName: z.string().trim().max(200).default(''),
	totalInkLimitPct: z.coerce
		.number({ error: 'The ink limit is a number of %' })
		.int('The ink limit is a whole number of %')
		.min(200, 'The ink limit is 200–400 %')
		.max(400, 'The ink limit is 200–400 %')
		.default(DEFAULT_INK_LIMIT_PCT)
});
export type PressCondition = z.infer<typeof PressConditionSchema>;

/**
 * A soft proof's choices, as query parameters (GET …/soft-proof.png) or JSON fields (the editor's
 * preview): which face, which press profile (a printer profile of the team; the game's default
 * when left out), the rendering intent, the ΔE2000 above which colours are striped, and whether
 * to stripe them at all.
 */
export const SoftProofChoiceSchema = z.object({
	side: z.enum(['front', 'back'], 'side is front or back').default('front'),
	profile: z.uuid('profile is the id of one of the team’s printer profiles').optional(),
	intent: z.enum(RENDERING_INTENTS, 'intent is relative or perceptual').default('relative'),
	deltaE: z.coerce
		.number({ error: `deltaE is a number from ${GAMUT_WARNING_MIN} to ${GAMUT_WARNING_MAX}` })
		.min(GAMUT_WARNING_MIN, `deltaE is a number from ${GAMUT_WARNING_MIN} to ${GAMUT_WARNING_MAX}`)
		.max(GAMUT_WARNING_MAX, `deltaE is a number from ${GAMUT_WARNING_MIN} to ${GAMUT_WARNING_MAX}`)
		.default(GAMUT_WARNING_DELTA_E2000),
	marks: z
		.union([z.boolean(), z.enum(['0', '1']).transform((v) => v === '1')])
		.default(true)
});
export type SoftProofChoice = z.output<typeof SoftProofChoiceSchema>;
