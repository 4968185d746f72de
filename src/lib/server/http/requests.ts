/**
 * Request bodies of the JSON API that belong to no one thing: each route validates with the
 * schema here and the OpenAPI document describes the same one.
 */
import { z } from 'zod';
import { ArtAssetSchema, CardKindSchema, CardSchema } from '$lib/game/model';
import { SoftProofChoiceSchema } from '$lib/schemas/printing';
import { SettingsSchema } from '../game-store';

/** Live preview: the kind and card as they stand in the editor, saved or not. */
export const PreviewRequestSchema = z.strictObject({
	kind: CardKindSchema,
	card: CardSchema.optional(),
	side: z.enum(['front', 'back']),
	guides: z.strictObject({ trim: z.boolean(), bleed: z.boolean(), safe: z.boolean() }).optional()
});

/** The editor's unsaved card soft-proofed: the choices of a soft proof, with the kind and card. */
export const PreviewSoftProofRequestSchema = z.strictObject({
	...SoftProofChoiceSchema.shape,
	kind: CardKindSchema,
	card: CardSchema.optional()
});

export const PrintJobRequestSchema = z.strictObject({
	/** A proof id or number; the working game when absent. */
	proof: z.string().max(40).optional(),
	/** What to build: the sheet PDF, or the zip of one PNG per face. */
	kind: z.enum(['sheets', 'pngs']).default('sheets'),
	/** The print route's query parameters (or `profile`); for PNGs, `dpi` and `kinds`. */
	query: z.record(z.string(), z.string().max(200)).default({})
});

/** Game settings with the version the caller read them at. */
export const SettingsRequestSchema = SettingsSchema.extend({ version: z.int().min(0) });

/** A new object of a collection; the collection's own schema checks it in full when saved. */
export const ObjectCreateSchema = z.looseObject({ id: z.string().optional() });

/** A changed object with the version it was read at; checked in full when saved. */
export const ObjectSaveSchema = z.looseObject({ version: z.int().min(0) });

/** Art changes only its status and slot here (its file only by uploading). */
export const ArtSaveSchema = ArtAssetSchema.partial().extend({ version: z.int().min(0) });
