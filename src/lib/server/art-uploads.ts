/**
 * Artwork uploads: a new art asset from a file, or a new file for an existing asset (a replace
 * keeps every earlier file in art_versions). The page's form actions and the API route both end
 * in `uploadArt`.
 *
 * Nothing is stored until everything has been checked: the file by inspectArt (type from its
 * bytes, size and pixel caps before any decode, SVG safety), the fields by their schemas, the
 * change against the whole game. The file is written last, inside the transaction that records
 * it, so a refusal leaves no file, no art_files row, no version and no art object behind.
 */
import { fail, redirect, type RequestEvent } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import { and, desc, eq, max } from 'drizzle-orm';
import type { Db } from './db';
import { artFiles, artVersions, users } from './db/schema';
import { ApiError, readBody } from './api';
import { requireGameRole } from './guard';
import { applyChanges, loadGame, StoreError, type Change } from './game-store';
import { storeArtFile } from './art-files';
import { StorageUnavailableError } from './storage';
import { db } from './runtime';
import { inspectArt, ArtRejected, MAX_ART_BYTES, type InspectedArt } from '$lib/art/inspect';
import { describeAssignment, parsePlaceKey } from '$lib/art/placement';
import {
	ART_EXTENSIONS,
	ArtAssetSchema,
	ArtAssignmentSchema,
	ArtStatusSchema,
	IdSchema,
	newId,
	type ArtAsset,
	type ArtAssignment,
	type ArtStatus,
	type Game
} from '$lib/game/model';

/** Room for a multipart body's boundaries and small fields around the file (our own allowance). */
export const FORM_ROOM_BYTES = 64 * 1024;

const MIB = 1024 * 1024;

/* ------------------------------------------------------------ schemas */

/** The fields of an upload, as the API takes them (multipart fields, or query parameters with a raw body). */
export const UploadFieldsSchema = z
	.object({
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
export const UploadFormSchema = z.object({
	file: z.instanceof(File, { message: 'Choose an art file (PNG, JPEG or SVG).' }),
	status: ArtStatusSchema.default('sketch'),
	place: z.string().max(400).default('')
});

/** The Art page's replace form, for one asset. */
export const ReplaceFormSchema = z.object({
	file: z.instanceof(File, { message: 'Choose the new file (PNG, JPEG or SVG).' }),
	artId: IdSchema,
	version: z.int().min(1),
	status: z.enum(['keep', ...ArtStatusSchema.options]).default('keep')
});

/** What the Art page changes about an asset without a new file: its status and where it prints. */
export const ArtPlacementSchema = ArtAssetSchema.pick({ id: true, status: true, assignment: true, version: true });

/* ------------------------------------------------------------- uploads */

export interface UploadRequest {
	bytes: Uint8Array;
	fileName: string;
	/** New art: 'sketch' when not given. Replaced art: unchanged when not given. */
	status?: ArtStatus;
	/** New art only; absent or null leaves it unassigned. */
	assignment?: ArtAssignment | null;
	replaces?: { artId: string; version: number };
}

export interface UploadOutcome {
	art: ArtAsset;
	replaced: boolean;
	version: { number: number; sha256: string; fileName: string; createdAt: Date };
	/** Assets that held the slot before and are now unassigned (kept, not deleted). */
	displaced: ArtAsset[];
	/** The game after the change. */
	game: Game;
}

/** Inspects, checks and stores one upload; throws ArtRejected or StoreError (with a status) when refused. */
export async function uploadArt(
	d: Db,
	gameId: string,
	upload: UploadRequest,
	by: { userId: string; teamId: string }
): Promise<UploadOutcome> {
	if (upload.bytes.byteLength === 0) throw new StoreError(400, 'The upload is empty: choose an art file (PNG, JPEG or SVG).');
	const inspected = await inspectArt(upload.bytes, upload.fileName);
	const fileName = cleanFileName(upload.fileName, inspected);
	const before = await loadGame(d, gameId);

	let object: ArtAsset;
	let displaced: ArtAsset[] = [];
	if (upload.replaces) {
		const current = before.art.find((a) => a.id === upload.replaces!.artId);
		if (!current) throw new StoreError(404, `No art piece with id ${upload.replaces.artId} in this game`);
		if (current.sha256 === inspected.sha256)
			throw new StoreError(400, `This is the very file “${current.fileName}” already has; nothing was replaced.`);
		const { version: _v, dpiX: _x, dpiY: _y, ...kept } = current;
		object = { ...kept, ...fileFacts(inspected), fileName, status: upload.status ?? current.status };
	} else {
		object = {
			id: newId(),
			...fileFacts(inspected),
			fileName,
			status: upload.status ?? 'sketch',
			assignment: upload.assignment ?? null
		};
		displaced = holdersOf(before, object.assignment, object.id);
	}
	const changes: Change[] = [
		{ collection: 'art', id: object.id, baseVersion: upload.replaces ? upload.replaces.version : null, object },
		...displaced.map(unassign)
	];

	return d.transaction(async (tx) => {
		const t = tx as unknown as Db;
		// Checks the versions and the whole game; throws (and writes nothing) when anything is wrong.
		const game = await applyChanges(t, gameId, changes, {
			userId: by.userId,
			teamId: by.teamId,
			action: upload.replaces ? 'art.replaced' : 'art.uploaded'
		});
		const [{ last }] = await tx
			.select({ last: max(artVersions.number) })
			.from(artVersions)
			.where(and(eq(artVersions.gameId, gameId), eq(artVersions.artId, object.id)));
		await storeArtFile(t, inspected.bytes, inspected, inspected.thumbnail.bytes).catch((e) => {
			// The transaction rolls back: no row points at a file the store does not have.
			if (e instanceof StorageUnavailableError) throw new StoreError(503, 'The file store cannot be reached right now, so nothing was stored. Try again in a moment.');
			throw e;
		});
		const [version] = await tx
			.insert(artVersions)
			.values({ gameId, artId: object.id, number: (last ?? 0) + 1, sha256: inspected.sha256, fileName, uploadedBy: by.userId })
			.returning();
		return {
			art: game.art.find((a) => a.id === object.id)!,
			replaced: Boolean(upload.replaces),
			version: { number: version.number, sha256: version.sha256, fileName: version.fileName, createdAt: version.createdAt },
			displaced,
			game
		};
	});
}

const fileFacts = (i: InspectedArt) => ({
	sha256: i.sha256,
	mime: i.mime,
	widthPx: i.widthPx,
	heightPx: i.heightPx,
	...(i.dpiX !== undefined && { dpiX: i.dpiX }),
	...(i.dpiY !== undefined && { dpiY: i.dpiY })
});

/** The name as people know the file: no folders, no control characters, at most 255 characters. */
function cleanFileName(raw: string, inspected: InspectedArt): string {
	const base = (raw.split(/[\\/]/).pop() ?? '').replace(/[\u0000-\u001f\u007f]/g, '').trim();
	return base ? base.slice(0, 255) : `art.${ART_EXTENSIONS[inspected.mime]}`;
}

/**
 * Other assets assigned to exactly this slot. The layout shows only the first one assigned, so
 * a new assignment takes the slot over and the earlier holders become unassigned (kept).
 */
function holdersOf(game: Game, assignment: ArtAssignment | null, exceptId: string): ArtAsset[] {
	if (!assignment) return [];
	return game.art.filter(
		(a) =>
			a.id !== exceptId &&
			a.assignment?.scope === assignment.scope &&
			a.assignment.targetId === assignment.targetId &&
			a.assignment.slot === assignment.slot
	);
}

const unassign = (a: ArtAsset): Change => ({
	collection: 'art',
	id: a.id,
	baseVersion: a.version ?? null,
	object: { ...a, version: undefined, assignment: null }
});

/** Status and assignment of an existing asset; its file is untouched. Takes the slot over like an upload. */
export async function placeArt(
	d: Db,
	gameId: string,
	change: z.infer<typeof ArtPlacementSchema>,
	by: { userId: string; teamId: string }
): Promise<{ art: ArtAsset; displaced: ArtAsset[]; game: Game }> {
	const before = await loadGame(d, gameId);
	const current = before.art.find((a) => a.id === change.id);
	if (!current) throw new StoreError(404, `No art piece with id ${change.id} in this game`);
	const { version: _v, ...kept } = current;
	const object: ArtAsset = { ...kept, status: change.status, assignment: change.assignment };
	const displaced = holdersOf(before, object.assignment, object.id);
	const after = await applyChanges(
		d,
		gameId,
		[{ collection: 'art', id: object.id, baseVersion: change.version ?? null, object }, ...displaced.map(unassign)],
		{ userId: by.userId, teamId: by.teamId, action: 'art.saved' }
	);
	return { art: after.art.find((a) => a.id === object.id)!, displaced, game: after };
}

/* ------------------------------------------------------------- reading */

const tooLarge = () =>
	new ArtRejected('too-large', `This file is larger than ${MAX_ART_BYTES / MIB} MB; Paddock accepts art files up to ${MAX_ART_BYTES / MIB} MB.`);

/** Reads a body up to `limit`, refusing a larger one (413) before reading it all. */
async function readCapped(request: Request, limit: number): Promise<Uint8Array> {
	try {
		return await readBody(request, limit);
	} catch (e) {
		if (e instanceof ApiError && e.status === 413) throw tooLarge();
		throw e;
	}
}

/** A multipart form body, read with the art cap (plus room for the fields) and then parsed. */
export async function readArtForm(request: Request): Promise<FormData> {
	const bytes = await readCapped(request, MAX_ART_BYTES + FORM_ROOM_BYTES);
	try {
		return await new Response(new Uint8Array(bytes), { headers: { 'content-type': request.headers.get('content-type') ?? '' } }).formData();
	} catch {
		throw new StoreError(400, 'The form could not be read; send the art as multipart/form-data.');
	}
}

/**
 * An API upload: the file as the multipart field `file` (other fields beside it), or the raw
 * body named by the `x-file-name` header (fields as query parameters).
 */
export async function readApiUpload(request: Request, url: URL): Promise<UploadRequest> {
	const type = request.headers.get('content-type') ?? '';
	let bytes: Uint8Array;
	let fileName: string;
	let field: (name: string) => string | undefined;
	if (type.startsWith('multipart/form-data')) {
		const form = await readArtForm(request);
		const file = form.get('file');
		if (!(file instanceof File)) throw new ApiError(400, 'Send the art as the multipart field “file” (or as the raw body with an x-file-name header)');
		bytes = new Uint8Array(await file.arrayBuffer());
		fileName = file.name;
		field = (name) => {
			const v = form.get(name);
			return typeof v === 'string' && v !== '' ? v : undefined;
		};
	} else {
		const header = request.headers.get('x-file-name');
		if (!header) throw new ApiError(400, 'Name the file with the x-file-name header (or send a multipart form with the field “file”)');
		fileName = decodeHeaderName(header);
		bytes = await readCapped(request, MAX_ART_BYTES);
		field = (name) => url.searchParams.get(name) || undefined;
	}
	const parsed = UploadFieldsSchema.safeParse(
		Object.fromEntries(['status', 'scope', 'targetId', 'slot', 'replaces', 'version'].map((k) => [k, field(k)]))
	);
	if (!parsed.success) {
		const issues = parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
		throw new ApiError(400, issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join('; '), 'invalid', issues);
	}
	const f = parsed.data;
	return {
		bytes,
		fileName,
		status: f.status,
		assignment: f.scope && f.targetId && f.slot ? { scope: f.scope, targetId: f.targetId, slot: f.slot } : null,
		...(f.replaces && { replaces: { artId: f.replaces, version: f.version! } })
	};
}

/** Header values are Latin-1; clients percent-encode other names (RFC 3986 §2.1). */
function decodeHeaderName(value: string): string {
	try {
		return decodeURIComponent(value);
	} catch {
		return value;
	}
}

/* -------------------------------------------------------- form actions */

type ArtEvent = RequestEvent<{ gameId: string }>;

/** Words for the person: what the upload did to the slot's earlier art. */
const displacedNote = (displaced: ArtAsset[]) =>
	displaced.length
		? ` ${displaced.map((a) => `“${a.fileName}”`).join(', ')} no longer ${displaced.length > 1 ? 'print' : 'prints'} there (kept, not assigned).`
		: '';

/** ?/upload: a new art asset from the page's form; on success, opens it. */
export async function uploadAction(event: ArtEvent) {
	const d = await db();
	const { user, game } = await requireGameRole(d, event.locals, event.params.gameId, 'art.edit');
	const empty = await superValidate(zod4(UploadFormSchema), { id: 'upload' });
	let body: FormData;
	try {
		body = await readArtForm(event.request);
	} catch (e) {
		if (e instanceof ArtRejected || e instanceof StoreError) return message(empty, e.message, { status: e.status });
		throw e;
	}
	const form = await superValidate(body, zod4(UploadFormSchema), { id: 'upload' });
	if (!form.valid) return fail(400, { form });
	let assignment: ArtAssignment | null = null;
	if (form.data.place) {
		const parsed = ArtAssignmentSchema.safeParse(parsePlaceKey(form.data.place));
		if (!parsed.success) return message(form, 'Choose where the art prints from the list.', { status: 400 });
		assignment = parsed.data;
	}
	let outcome: UploadOutcome;
	try {
		const file = form.data.file;
		outcome = await uploadArt(
			d,
			game.id,
			{ bytes: new Uint8Array(await file.arrayBuffer()), fileName: file.name, status: form.data.status, assignment },
			{ userId: user.id, teamId: game.teamId }
		);
	} catch (e) {
		if (e instanceof ArtRejected || e instanceof StoreError) return message(form, `Nothing was stored. ${e.message}`, { status: e.status });
		throw e;
	}
	// The page opens the new art and says what happened, displaced slot holders included.
	const took = outcome.displaced.map((a) => `&took=${encodeURIComponent(a.id)}`).join('');
	redirect(303, `/games/${game.id}/art?art=${encodeURIComponent(outcome.art.id)}&uploaded=1${took}`);
}

/** ?/replace: a new file for an existing asset; the earlier file stays in its history. */
export async function replaceAction(event: ArtEvent) {
	const d = await db();
	const { user, game } = await requireGameRole(d, event.locals, event.params.gameId, 'art.edit');
	const empty = await superValidate(zod4(ReplaceFormSchema), { id: 'replace' });
	let body: FormData;
	try {
		body = await readArtForm(event.request);
	} catch (e) {
		if (e instanceof ArtRejected || e instanceof StoreError) return message(empty, e.message, { status: e.status });
		throw e;
	}
	const form = await superValidate(body, zod4(ReplaceFormSchema), { id: 'replace' });
	if (!form.valid) return fail(400, { form });
	const { file, artId, version, status } = form.data;
	try {
		const outcome = await uploadArt(
			d,
			game.id,
			{
				bytes: new Uint8Array(await file.arrayBuffer()),
				fileName: file.name,
				status: status === 'keep' ? undefined : status,
				replaces: { artId, version }
			},
			{ userId: user.id, teamId: game.teamId }
		);
		// The form now stands for the new version, so a second replace is checked against it.
		form.data.version = outcome.art.version!;
		return message(
			form,
			`Replaced. “${outcome.art.fileName}” is version ${outcome.version.number}; the earlier files stay in the history below.`
		);
	} catch (e) {
		if (e instanceof ArtRejected || e instanceof StoreError) return message(form, `Nothing was replaced. ${e.message}`, { status: e.status });
		throw e;
	}
}

/** ?/save: status and assignment of one asset. */
export async function placeAction(event: ArtEvent) {
	const d = await db();
	const { user, game } = await requireGameRole(d, event.locals, event.params.gameId, 'art.edit');
	const form = await superValidate(event.request, zod4(ArtPlacementSchema), { id: 'placement' });
	if (!form.valid) return fail(400, { form });
	try {
		const { art, displaced, game: after } = await placeArt(d, game.id, form.data, { userId: user.id, teamId: game.teamId });
		const where = art.assignment ? `It prints on ${describeAssignment(after, art.assignment)}.` : 'It is not assigned to a slot.';
		return message(form, `Saved. ${where}${displacedNote(displaced)}`);
	} catch (e) {
		if (e instanceof StoreError) return message(form, e.message, { status: e.status });
		throw e;
	}
}

/* ------------------------------------------------------------- history */

export interface ArtVersionRow {
	artId: string;
	number: number;
	sha256: string;
	fileName: string;
	createdAt: Date;
	uploadedBy: string | null;
	mime: string;
	bytes: number;
	widthPx: number;
	heightPx: number;
	dpiX: number | null;
	dpiY: number | null;
}

/** Every file each of the game's art assets has had, newest first, keyed by art id. */
export async function artVersionsByArt(d: Db, gameId: string): Promise<Map<string, ArtVersionRow[]>> {
	const rows = await d
		.select({
			artId: artVersions.artId,
			number: artVersions.number,
			sha256: artVersions.sha256,
			fileName: artVersions.fileName,
			createdAt: artVersions.createdAt,
			uploadedBy: users.name,
			mime: artFiles.mime,
			bytes: artFiles.bytes,
			widthPx: artFiles.widthPx,
			heightPx: artFiles.heightPx,
			dpiX: artFiles.dpiX,
			dpiY: artFiles.dpiY
		})
		.from(artVersions)
		.innerJoin(artFiles, eq(artFiles.sha256, artVersions.sha256))
		.leftJoin(users, eq(users.id, artVersions.uploadedBy))
		.where(eq(artVersions.gameId, gameId))
		.orderBy(desc(artVersions.number));
	const byArt = new Map<string, ArtVersionRow[]>();
	for (const r of rows) byArt.set(r.artId, [...(byArt.get(r.artId) ?? []), r]);
	return byArt;
}
