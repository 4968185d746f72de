/**
 * The JSON the API answers with, as zod schemas: the routes build their answers to these types
 * (`satisfies ApiAnswer<…>`), the browser reads them with the same types, and the OpenAPI document
 * (`/api/v1/openapi.json`) is generated from them. Times travel as ISO 8601 strings.
 */
import { z } from 'zod';
import { ROLE_NAMES } from './account';

export type ApiAnswer<S extends z.ZodType> = z.input<S>;

export const ApiErrorSchema = z
	.object({ error: z.object({ code: z.string(), message: z.string() }) })
	.describe('Every refusal: 400, 401, 403, 404, 409, 413, 429 or 503.');

const Role = z.enum(ROLE_NAMES);

export const MeSchema = z
	.object({
		user: z.object({ id: z.string(), email: z.string(), name: z.string() }),
		memberships: z.array(z.object({ teamId: z.string(), teamName: z.string(), role: Role }))
	})
	;

export const MembersSchema = z
	.object({
		you: z.object({ userId: z.string(), role: Role, mayManage: z.boolean() }),
		members: z.array(z.object({ userId: z.string(), name: z.string(), email: z.string(), role: Role, since: z.iso.datetime() })),
		invitations: z.array(z.object({ id: z.string(), email: z.string(), role: Role, expiresAt: z.iso.datetime() }))
	})
	;

export const CardPreviewSchema = z
	.object({ svg: z.string().describe('The face as SVG, sized in mm'), warnings: z.array(z.string()) })
	;

export const SoftProofSchema = z
	.object({
		png: z.string().describe('The face as it will print, a PNG as a data: URL, moved colours striped'),
		widthPx: z.int(),
		heightPx: z.int(),
		thresholdDeltaE2000: z.number().describe('Colours that move more than this (CIEDE2000) are striped'),
		movedPct: z.number().describe('Share of the face over the threshold, in %'),
		maxDeltaE2000: z.number(),
		profileName: z.string(),
		conditionIdentifier: z.string()
	})
	.describe('A card face soft-proofed on a press profile');

export const PrintPreviewSchema = z
	.object({
		svg: z.string().describe("The build's first sheet as SVG (art linked, not embedded)"),
		sheets: z.int(),
		pages: z.int().describe('Every page of the document, the cutting guide included'),
		guidePages: z.int().describe('Of those, the cutting guide'),
		cardsPerSheet: z.int(),
		columns: z.int(),
		rows: z.int(),
		orientation: z.enum(['portrait', 'landscape']),
		warnings: z.array(z.string())
	})
	;

export const PrintJobSchema = z
	.object({
		id: z.string(),
		state: z.enum(['queued', 'running', 'done', 'failed']),
		done: z.int(),
		total: z.int(),
		error: z.string().optional(),
		sheets: z.int().optional(),
		pages: z.int().optional().describe('Every page of the document, the cutting guide included'),
		guidePages: z.int().optional().describe('Of those, the cutting guide'),
		bytes: z.int().optional(),
		warnings: z.array(z.string())
	})
	.describe('A sheet PDF being built; its file is at /api/v1/print-jobs/{jobId}/file once done.');

export const MuteSchema = z.strictObject({ muted: z.boolean() });

export const ProofCutSchema = z.object({ id: z.string(), number: z.int() });
