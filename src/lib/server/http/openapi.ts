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
import { CommentSchema, CutSchema, VerdictSchema, WithdrawSchema } from '../proofs';
import { DeleteGameSchema } from '../game-lifecycle';
import { RestoreSchema } from '../history';
import { RaceRequestSchema, SavedScenarioInputSchema } from '../odds';
import { OddsRequestSchema } from '$lib/odds/report';
import {
	ArtSaveSchema,
	ObjectCreateSchema,
	ObjectSaveSchema,
	PreviewRequestSchema,
	PreviewSoftProofRequestSchema,
	PrintJobRequestSchema,
	SettingsRequestSchema
} from './requests';

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
/** Builds past the print queue's bound are refused, nothing queued, with when to come back. */
const queueFull = {
	503: {
		...answer('The print queue is full: nothing was queued; try again after Retry-After seconds', 'Error'),
		headers: { 'Retry-After': { description: 'Seconds until a place in the queue is likely free', schema: { type: 'integer', minimum: 1 } } }
	}
};

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
	'/api/v1/teams': {
		get: op("The caller's teams", { 200: answer('The teams') }),
		post: op('Make a team', { 201: answer('The new team') }, teamSchema)
	},
	'/api/v1/teams/{teamId}/games': {
		get: op("The team's games", { 200: answer('The games') }),
		post: op('Make a game in the team', { 201: answer('The new game') }, gameCreateSchema)
	},
	'/api/v1/teams/{teamId}/games/import': {
		post: op('Import a game bundle (zip, as the raw body or the multipart field "file")', { 201: answer('The new game') })
	},
	'/api/v1/teams/{teamId}/members': { get: op('Members and open invitations', { 200: answer('The team', 'Members') }) },
	'/api/v1/teams/{teamId}/members/{userId}': {
		patch: op("Change a member's role (owner)", { 200: answer('Changed') }, roleChangeSchema),
		delete: op('Remove a member (owner)', { 200: answer('Removed') })
	},
	'/api/v1/teams/{teamId}/invitations': { post: op('Invite someone by e-mail (owner)', { 201: answer('Invited') }, inviteSchema) },
	'/api/v1/teams/{teamId}/printer-profiles': {
		get: op("The team's printer profiles", { 200: answer('The profiles') }),
		post: op('Add a printer profile', { 201: answer('The profile', 'PrinterProfile') }, PrinterProfileSchema)
	},
	'/api/v1/teams/{teamId}/printer-profiles/{profileId}': {
		put: op('Change a printer profile', { 200: answer('The profile', 'PrinterProfile') }, PrinterProfileSchema),
		delete: op('Delete a printer profile', { 200: answer('Deleted') })
	},
	'/api/v1/games/{gameId}': {
		get: op('The whole game', { 200: answer('The game', { type: 'object', properties: { game: ref('Game') }, required: ['game'] }) }),
		delete: op('Deletes the game with its proofs and files (owners; confirm with the game\'s name, here or as ?confirm=)', { 200: answer('Deleted') }, DeleteGameSchema)
	},
	'/api/v1/games/{gameId}/duplicate': { post: op('A new game with its own copy of this one\'s data and art', { 201: answer('The new game') }) },
	'/api/v1/games/{gameId}/{collection}': {
		get: op('The objects of one collection (runners, money-tables, kinds, cards, art, …)', { 200: answer('The objects') }),
		post: op('Add an object to the collection', { 201: answer('The object, with its version') }, ObjectCreateSchema)
	},
	'/api/v1/games/{gameId}/{collection}/{objectId}': {
		get: op('One object', { 200: answer('The object') }),
		put: op('Save an object read at `version` (art: its status and slot only)', { 200: answer('The object, with its new version') }, ObjectSaveSchema.or(ArtSaveSchema)),
		delete: op('Delete an object (?version=N)', { 200: answer('Deleted') })
	},
	'/api/v1/games/{gameId}/history': { get: op("Saved versions of the game's objects and settings (?collection=runners, money-tables, kinds, cards, art or settings; &objectId=&limit=)", { 200: answer('The versions') }) },
	'/api/v1/games/{gameId}/history/{versionId}/restore': { post: op('Restore a version as a new version (stale restores refused like stale saves)', { 201: answer('The restored object') }, RestoreSchema) },
	'/api/v1/games/{gameId}/settings': { put: op('Save the game settings read at `version`', { 200: answer('The settings') }, SettingsRequestSchema) },
	'/api/v1/games/{gameId}/art/upload': {
		post: op('Upload an art file (multipart field "file", or the raw body with x-file-name)', { 201: answer('The art piece') })
	},
	'/api/v1/games/{gameId}/art-files/{sha256}': { get: op('An art file (or ?thumb=1 its thumbnail)', { 200: file('application/octet-stream', 'The file') }) },
	'/api/v1/games/{gameId}/bundle.zip': { get: op('The game as a bundle: data and art', { 200: file('application/zip', 'The bundle') }) },
	'/api/v1/games/{gameId}/cards/{cardId}/face.svg': { get: op('A card front as SVG', { 200: file('image/svg+xml', 'The face') }) },
	'/api/v1/games/{gameId}/cards/{cardId}/back.svg': { get: op('A card back as SVG', { 200: file('image/svg+xml', 'The back') }) },
	'/api/v1/games/{gameId}/cards/{cardId}/press.pdf': { get: op('One card as a press PDF', { 200: file('application/pdf', 'The PDF') }) },
	'/api/v1/games/{gameId}/cards.zip': { get: op('One PNG per face (?dpi=)', { 200: file('application/zip', 'The zip') }) },
	'/api/v1/games/{gameId}/deck-check': { get: op("The game's readiness: what still needs a look", { 200: answer('The check') }) },
	'/api/v1/games/{gameId}/odds': { post: op('Run the odds lab: a stage scenario or whole races', { 200: answer('The answer'), 202: answer('A large run, as a job to follow') }, OddsRequestSchema.or(RaceRequestSchema)) },
	'/api/v1/games/{gameId}/odds/scenarios': {
		get: op("The game's saved scenarios", { 200: answer('The scenarios') }),
		post: op('Save a scenario (the same name replaces it)', { 201: answer('The scenario') }, SavedScenarioInputSchema)
	},
	'/api/v1/odds-jobs/{jobId}': {
		get: op("A large odds run's progress, then its answer", { 200: answer('The run') }),
		delete: op('Cancel an odds run', { 200: answer('The run') })
	},
	'/api/v1/games/{gameId}/preview': { post: op('An unsaved kind and card drawn as SVG', { 200: answer('The face', 'CardPreview') }, PreviewRequestSchema) },
	'/api/v1/games/{gameId}/preview/soft-proof': {
		post: op('An unsaved card as it will print on a press profile, moved colours striped', { 200: answer('The soft proof', 'SoftProof') }, PreviewSoftProofRequestSchema)
	},
	'/api/v1/games/{gameId}/cards/{cardId}/soft-proof.png': {
		get: op('A card face as it will print (side, profile, intent, deltaE, marks)', { 200: file('image/png', 'The soft proof') })
	},
	'/api/v1/games/{gameId}/proofs/{proofId}/cards/{cardId}/soft-proof.png': {
		get: op("A proof's card face as it will print (side, profile, intent, deltaE, marks)", { 200: file('image/png', 'The soft proof') })
	},
	'/api/v1/games/{gameId}/print-preview': { get: op('The first sheet of a build, as SVG, with the plan', { 200: answer('The sheet', 'PrintPreview') }) },
	'/api/v1/games/{gameId}/print.pdf': { get: op('The imposed sheets', { 200: file('application/pdf', 'The PDF') }) },
	'/api/v1/games/{gameId}/print-jobs': { post: op('Start building the sheets or a PNG zip', { 202: answer('The job', 'PrintJob'), ...queueFull }, PrintJobRequestSchema) },
	'/api/v1/print/calibration.pdf': { get: op('A duplex calibration sheet (paper, duplex, margin)', { 200: file('application/pdf', 'The PDF') }) },
	'/api/v1/press-colour': { get: op('A screen colour (?hex=) as it will print', { 200: answer('The colour') }) },
	'/api/v1/openapi.json': { get: op('This document', { 200: answer('The OpenAPI document') }) },
	'/api/v1/print-jobs/{jobId}': { get: op("A build's progress", { 200: answer('The job', 'PrintJob') }) },
	'/api/v1/print-jobs/{jobId}/events': {
		get: op("A build's progress as server-sent events: `state` events (each the job as GET /api/v1/print-jobs/{jobId} answers it) until it is done or failed", {
			200: file('text/event-stream', 'The events')
		})
	},
	'/api/v1/print-jobs/{jobId}/file': { get: op("A finished build's PDF", { 200: file('application/pdf', 'The PDF') }) },
	'/api/v1/games/{gameId}/mute': {
		get: op("Whether the game's e-mail to the caller is off", { 200: answer('The setting', 'Mute') }),
		put: op("Turn the game's e-mail to the caller off or on", { 200: answer('The setting', 'Mute') }, MuteSchema)
	},
	'/api/v1/games/{gameId}/proofs': {
		get: op("The game's proofs (printers: released ones)", { 200: answer('The proofs') }),
		post: op('Cut a proof', { 201: answer('The proof', 'ProofCut') }, CutSchema)
	},
	'/api/v1/games/{gameId}/proofs/compare': { get: op('What changed between two proofs (?a=&b=)', { 200: answer('The changes') }) },
	'/api/v1/games/{gameId}/proofs/compare/diff.png': {
		get: op("The pixel difference of one card's face between two proofs (?a=&b=&card=&side=)", { 200: file('image/png', 'The difference') })
	},
	'/api/v1/games/{gameId}/proofs/{proofId}': { get: op('One proof: its snapshot, comments and verdicts', { 200: answer('The proof') }) },
	'/api/v1/games/{gameId}/proofs/{proofId}/release': { post: op('Release a proof to the printers', { 200: answer('Released') }) },
	'/api/v1/games/{gameId}/proofs/{proofId}/comments/{commentId}/resolve': { post: op('Resolve a comment thread', { 200: answer('Resolved') }) },
	'/api/v1/games/{gameId}/proofs/{proofId}/print.pdf': { get: op("The proof's imposed sheets", { 200: file('application/pdf', 'The PDF') }) },
	'/api/v1/games/{gameId}/proofs/{proofId}/cards.zip': { get: op("One PNG per face of the proof (?dpi=)", { 200: file('application/zip', 'The zip') }) },
	'/api/v1/games/{gameId}/proofs/{proofId}/art-files/{sha256}': { get: op('An art file the proof froze', { 200: file('application/octet-stream', 'The file') }) },
	'/api/v1/games/{gameId}/proofs/{proofId}/cards/{cardId}/face.svg': { get: op("A proof's card front as SVG", { 200: file('image/svg+xml', 'The face') }) },
	'/api/v1/games/{gameId}/proofs/{proofId}/cards/{cardId}/back.svg': { get: op("A proof's card back as SVG", { 200: file('image/svg+xml', 'The back') }) },
	'/api/v1/games/{gameId}/proofs/{proofId}/cards/{cardId}/press.pdf': { get: op("One card of the proof as a press PDF", { 200: file('application/pdf', 'The PDF') }) },
	'/api/v1/games/{gameId}/proofs/{proofId}/comments': {
		get: op("The proof's comments", { 200: answer('The comments') }),
		post: op('Pin a comment or reply', { 201: answer('The comment') }, CommentSchema)
	},
	'/api/v1/games/{gameId}/proofs/{proofId}/verdicts': {
		get: op("The proof's verdicts", { 200: answer('The verdicts') }),
		post: op('Give a verdict', { 201: answer('The verdict') }, VerdictSchema)
	},
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
