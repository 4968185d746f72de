/** Printer profiles: how one printer (at home or a shop) takes sheets. Shared by form, API and print page. */
import { z } from 'zod';
import { DEFAULT_MARGIN_MM, PrintSettingsSchema } from '$lib/print/options';

/** A printer's settings (./print/options.ts holds their units and limits), named and versioned. */
export const PrinterProfileSchema = z
	.object({
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
	colour: 'rgb'
};
