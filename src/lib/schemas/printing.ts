/** Printer profiles: how one printer (at home or a shop) takes sheets. Shared by form, API and print page. */
import { z } from 'zod';

export const PrinterProfileSchema = z
	.object({
		id: z.string().uuid().optional(),
		name: z.string().trim().min(1, 'Name the profile').max(60),
		paper: z.enum(['a4', 'a3', 'letter', 'tabloid', 'custom']),
		customWidthMm: z.number().min(50).max(1500).optional(),
		customHeightMm: z.number().min(50).max(1500).optional(),
		/** What the printer cannot reach at the sheet's edges. */
		marginMm: z.number().min(0).max(50),
		layout: z.enum(['spaced', 'butted', 'fold']),
		marks: z.boolean(),
		duplex: z.enum(['none', 'long', 'short']),
		/** Read off the calibration sheet: how far the back lands right (+x) and below (+y) of the front. */
		backOffsetXMm: z.number().min(-10).max(10),
		backOffsetYMm: z.number().min(-10).max(10),
		colour: z.enum(['rgb', 'cmyk']),
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
	marginMm: 5,
	layout: 'spaced',
	marks: true,
	duplex: 'long',
	backOffsetXMm: 0,
	backOffsetYMm: 0,
	colour: 'rgb'
};

/** A profile as the print route's query parameters. */
export function profileQuery(p: PrinterProfile): Record<string, string> {
	return {
		paper: p.paper === 'custom' ? `custom:${p.customWidthMm}x${p.customHeightMm}` : p.paper,
		margin: String(p.marginMm),
		layout: p.layout,
		marks: p.marks ? '1' : '0',
		duplex: p.duplex,
		backX: String(p.backOffsetXMm),
		backY: String(p.backOffsetYMm),
		colour: p.colour
	};
}
