/**
 * The API described as an OpenAPI 3.1 document, generated from the same zod schemas the routes
 * validate requests with and build their answers to (zod's own JSON Schema output). Served at
 * /api/v1/openapi.json.
 */
import { z } from 'zod';
import { gameCreateSchema, inviteSchema, roleChangeSchema, teamSchema } from '$lib/schemas/account';
import {
	ApiErrorSchema,
	CardPreviewSchema,
	MembersSchema,
	MeSchema,
	MuteSchema,
	PrintJobSchema,
	PrintPreviewSchema,
	ProofCutSchema,
	SoftProofSchema
} from '$lib/schemas/api';
import { PrinterProfileSchema } from '$lib/schemas/printing';
import { GameSchema } from '$lib/game/model';
import { CommentSchema, CutSchema, VerdictSchema, WithdrawSchema } from './proofs';
import { DeleteGameSchema } from './game-lifecycle';

/** Answers named in components.schemas, referred to by the paths. */
const NAMED = {
	Error: ApiErrorSchema,
	Me: MeSchema,
	Members: MembersSchema,
	CardPreview: CardPreviewSchema,
	PrintPreview: PrintPreviewSchema,
	SoftProof: SoftProofSchema,
	PrintJob: PrintJobSchema,
	Mute: MuteSchema,
	ProofCut: ProofCutSchema,
	Game: GameSchema,
	PrinterProfile: PrinterProfileSchema
} as const;
type Named = keyof typeof NAMED;

function jsonSchema(schema: z.ZodType, io: 'input' | 'output') {
	// Drop the dialect line: the document's own dialect (JSON Schema 2020-12) applies.
	const { $schema: _dialect, ...rest } = z.toJSONSchema(schema, { io, unrepresentable: 'any', reused: 'inline' }) as Record<string, unknown>;
	return rest;
}

const ref = (name: Named) => ({ $ref: `#/components/schemas/${name}` });
const answer = (description: string, schema?: Named | Record<string, unknown>, type = 'application/json') => ({
	description,
	...(schema ? { content: { [type]: { schema: typeof schema === 'string' ? ref(schema) : schema } } } : {})
});
const body = (schema: z.ZodType) => ({ required: true, content: { 'application/json': { schema: jsonSchema(schema, 'input') } } });
const file = (type: string, description: string) => answer(description, { type: 'string', contentMediaType: type }, type);
const refusals = { default: answer('A refusal with its reason', 'Error') };

type Operation = { summary: string; requestBody?: unknown; responses: Record<string, unknown>; parameters?: unknown[] };
const op = (summary: string, responses: Record<string, unknown>, requestBody?: z.ZodType): Operation => ({
	summary,
	...(requestBody ? { requestBody: body(requestBody) } : {}),
	responses: { ...responses, ...refusals }
});

/** Path parameters named in `{…}` become required string parameters. */
function withParameters(path: string, ops: Record<string, Operation>) {
	const names = [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);
	const parameters = names.map((name) => ({ name, in: 'path', required: true, schema: { type: 'string' } }));
	return Object.fromEntries(Object.entries(ops).map(([method, o]) => [method, parameters.length ? { ...o, parameters } : o]));
}

const PATHS: Record<string, Record<string, Operation>> = {
	'/api/v1/me': { get: op('Who is calling, and their teams', { 200: answer('The caller', 'Me') }) },
	'/api/v1/teams': { post: op('Make a team', { 201: answer('The new team') }, teamSchema) },
	'/api/v1/teams/{teamId}/games': { post: op('Make a game in the team', { 201: answer('The new game') }, gameCreateSchema) },
	'/api/v1/teams/{teamId}/members': { get: op('Members and open invitations', { 200: answer('The team', 'Members') }) },
	'/api/v1/teams/{teamId}/members/{userId}': { patch: op("Change a member's role (owner)", { 200: answer('Changed') }, roleChangeSchema) },
	'/api/v1/teams/{teamId}/invitations': { post: op('Invite someone by e-mail (owner)', { 201: answer('Invited') }, inviteSchema) },
	'/api/v1/teams/{teamId}/printer-profiles': { post: op('Add a printer profile', { 201: answer('The profile', 'PrinterProfile') }, PrinterProfileSchema) },
	'/api/v1/teams/{teamId}/printer-profiles/{profileId}': { put: op('Change a printer profile', { 200: answer('The profile', 'PrinterProfile') }, PrinterProfileSchema) },
	'/api/v1/games/{gameId}': {
		get: op('The whole game', { 200: answer('The game', { type: 'object', properties: { game: ref('Game') }, required: ['game'] }) }),
		delete: op('Deletes the game with its proofs and files (owners; confirm with the game\'s name, here or as ?confirm=)', { 200: answer('Deleted') }, DeleteGameSchema)
	},
	'/api/v1/games/{gameId}/duplicate': { post: op('A new game with its own copy of this one\'s data and art', { 201: answer('The new game') }) },
	'/api/v1/games/{gameId}/preview': { post: op('An unsaved kind and card drawn as SVG', { 200: answer('The face', 'CardPreview') }) },
	'/api/v1/games/{gameId}/preview/soft-proof': {
		post: op('An unsaved card as it will print on a press profile, moved colours striped', { 200: answer('The soft proof', 'SoftProof') })
	},
	'/api/v1/games/{gameId}/cards/{cardId}/soft-proof.png': {
		get: op('A card face as it will print (side, profile, intent, deltaE, marks)', { 200: file('image/png', 'The soft proof') })
	},
	'/api/v1/games/{gameId}/proofs/{proofId}/cards/{cardId}/soft-proof.png': {
		get: op("A proof's card face as it will print (side, profile, intent, deltaE, marks)", { 200: file('image/png', 'The soft proof') })
	},
	'/api/v1/games/{gameId}/print-preview': { get: op('The first sheet of a build, as SVG, with the plan', { 200: answer('The sheet', 'PrintPreview') }) },
	'/api/v1/games/{gameId}/print.pdf': { get: op('The imposed sheets', { 200: file('application/pdf', 'The PDF') }) },
	'/api/v1/games/{gameId}/print-jobs': { post: op('Start building the sheets', { 202: answer('The job', 'PrintJob') }) },
	'/api/v1/print-jobs/{jobId}': { get: op("A build's progress", { 200: answer('The job', 'PrintJob') }) },
	'/api/v1/print-jobs/{jobId}/file': { get: op("A finished build's PDF", { 200: file('application/pdf', 'The PDF') }) },
	'/api/v1/games/{gameId}/mute': {
		get: op("Whether the game's e-mail to the caller is off", { 200: answer('The setting', 'Mute') }),
		put: op("Turn the game's e-mail to the caller off or on", { 200: answer('The setting', 'Mute') }, MuteSchema)
	},
	'/api/v1/games/{gameId}/proofs': { post: op('Cut a proof', { 201: answer('The proof', 'ProofCut') }, CutSchema) },
	'/api/v1/games/{gameId}/proofs/{proofId}/comments': { post: op('Pin a comment or reply', { 201: answer('The comment') }, CommentSchema) },
	'/api/v1/games/{gameId}/proofs/{proofId}/verdicts': { post: op('Give a verdict', { 201: answer('The verdict') }, VerdictSchema) },
	'/api/v1/games/{gameId}/proofs/{proofId}/withdraw': { post: op('Withdraw a release', { 200: answer('Withdrawn') }, WithdrawSchema) }
};

export function openApiDocument() {
	return {
		openapi: '3.1.0',
		info: {
			title: 'Paddock API',
			version: '1',
			description:
				'Session cookie (from Paddock\'s own pages) or `Authorization: Bearer pdk_…` (a personal token made on the account page).'
		},
		components: {
			schemas: Object.fromEntries(Object.entries(NAMED).map(([name, schema]) => [name, jsonSchema(schema, 'output')])),
			securitySchemes: { token: { type: 'http', scheme: 'bearer' } }
		},
		security: [{ token: [] }],
		paths: Object.fromEntries(Object.entries(PATHS).map(([path, ops]) => [path, withParameters(path, ops)]))
	};
}
