/** The art forms and the upload API's fields: shared by the Art page (server and browser) and the API. */
import { z } from 'zod';
import { ArtAssetSchema, ArtAssignmentSchema, ArtStatusSchema, IdSchema } from '$lib/game/model';

/** The fields of an upload, as the API takes them (multipart fields, or query parameters with a raw body). */
export const UploadFieldsSchema = z
	.strictObject({
		status: ArtStatusSchema.optional(),
		scope: ArtAssignmentSchema.shape.scope.optional(),
		targetId: IdSchema.optional(),
		slot: ArtAssignmentSchema.shape.slot.optional(),
		/** Replace this asset's file instead of making a new asset. */
		replaces: IdSchema.optional(),
		/** With `replaces`: the asset version the caller saw. */
		version: z.coerce.number().int().min(1).optional()
	})
	.superRefine((f, ctx) => {
		const given = [f.scope, f.targetId, f.slot].filter((v) => v !== undefined).length;
		if (given !== 0 && given !== 3)
			ctx.addIssue({ code: 'custom', path: ['scope'], message: 'To assign the art, give scope, targetId and slot together' });
		if (f.replaces && f.version === undefined)
			ctx.addIssue({ code: 'custom', path: ['version'], message: 'Say which version of the art you are replacing (version)' });
		if (f.replaces && given)
			ctx.addIssue({ code: 'custom', path: ['replaces'], message: 'A replaced file keeps its assignment; change it with PUT …/art/{id}' });
	});

/** The Art page's upload form: `place` is a slot picker's value (see $lib/art/placement.ts). */
export const UploadFormSchema = z.strictObject({
	file: z.instanceof(File, { message: 'Choose an art file (PNG, JPEG or SVG).' }),
	status: ArtStatusSchema.default('sketch'),
	place: z.string().max(400).default('')
});

/** The Art page's replace form, for one asset. */
export const ReplaceFormSchema = z.strictObject({
	file: z.instanceof(File, { message: 'Choose the new file (PNG, JPEG or SVG).' }),
	artId: IdSchema,
	version: z.int().min(1),
	status: z.enum(['keep', ...ArtStatusSchema.options]).default('keep')
});

/** What the Art page changes about an asset without a new file: its status and where it prints. */
export const ArtPlacementSchema = ArtAssetSchema.pick({ id: true, status: true, assignment: true, version: true });
