/**
 * The art uploads over HTTP: reading an upload from the API (multipart or a raw body) or from the
 * Art page's forms, with the size cap applied while reading, and the page's form actions. Every
 * path ends in the service's `uploadArt` or `placeArt` ($lib/server/art-uploads.ts).
 */
import { fail, redirect, type RequestEvent } from '@sveltejs/kit';
import { superValidate, message } from 'sveltekit-superforms';
import { zod4, type ValidationAdapter } from 'sveltekit-superforms/adapters';
import { readBody } from './api';
import { requireGameRole } from './guard';
import { db } from '../runtime';
import { placeArt, uploadArt, type UploadOutcome, type UploadRequest } from '../art-uploads';
import { checkedForm } from './form-text';
import { ArtPlacementSchema, ReplaceFormSchema, UploadFieldsSchema, UploadFormSchema } from '$lib/schemas/art';
import { ArtRejected, MAX_ART_BYTES } from '$lib/art/inspect';
import { describeAssignment, parsePlaceKey } from '$lib/art/placement';
import { ArtAssignmentSchema, type ArtAsset, type ArtAssignment } from '$lib/game/model';
import { answerFor } from './answers';
import { Invalid, Refusal } from '../refusals';

/** Room for a multipart body's boundaries and small fields around the file (our own allowance). */
export const FORM_ROOM_BYTES = 64 * 1024;

const MIB = 1024 * 1024;

/* ------------------------------------------------------------- reading */

const tooLarge = () =>
	new ArtRejected('too-large', `This file is larger than ${MAX_ART_BYTES / MIB} MB; Paddock accepts art files up to ${MAX_ART_BYTES / MIB} MB.`);

/** Reads a body up to `limit`, refusing a larger one (413) before reading it all. */
async function readCapped(request: Request, limit: number): Promise<Uint8Array> {
	try {
		return await readBody(request, limit);
	} catch (e) {
		if (e instanceof Refusal && e.reason === 'too-large') throw tooLarge();
		throw e;
	}
}

/** A multipart form body, read with the art cap (plus room for the fields) and then parsed. */
export async function readArtForm(request: Request): Promise<FormData> {
	const bytes = await readCapped(request, MAX_ART_BYTES + FORM_ROOM_BYTES);
	let form: FormData;
	try {
		form = await new Response(new Uint8Array(bytes), { headers: { 'content-type': request.headers.get('content-type') ?? '' } }).formData();
	} catch {
		throw new Invalid('The form could not be read; send the art as multipart/form-data.');
	}
	return checkedForm(form);
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
		if (!(file instanceof File)) throw new Invalid('Send the art as the multipart field “file” (or as the raw body with an x-file-name header)');
		bytes = new Uint8Array(await file.arrayBuffer());
		fileName = file.name;
		field = (name) => {
			const v = form.get(name);
			return typeof v === 'string' && v !== '' ? v : undefined;
		};
	} else {
		const header = request.headers.get('x-file-name');
		if (!header) throw new Invalid('Name the file with the x-file-name header (or send a multipart form with the field “file”)');
		fileName = decodeHeaderName(header);
		bytes = await readCapped(request, MAX_ART_BYTES);
		field = (name) => url.searchParams.get(name) || undefined;
	}
	const parsed = UploadFieldsSchema.safeParse(
		Object.fromEntries(['status', 'scope', 'targetId', 'slot', 'replaces', 'version'].map((k) => [k, field(k)]))
	);
	if (!parsed.success) {
		const issues = parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
		throw new Invalid(issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join('; '), issues, 'invalid');
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

/**
 * The opening both file forms share: the caller may change art, the body is read within the art
 * cap (a refusal answers on the form), and the fields are validated. Either the answer to give
 * at once, or the caller and the valid form.
 */
async function openArtForm<Out extends Record<string, unknown>, In extends Record<string, unknown>>(
	event: ArtEvent,
	adapter: ValidationAdapter<Out, In>,
	id: 'upload' | 'replace'
) {
	const d = await db();
	const { game, actor } = await requireGameRole(d, event.locals, event.params.gameId, 'art.edit');
	let body: FormData;
	try {
		body = await readArtForm(event.request);
	} catch (e) {
		const refused = answerFor(e);
		if (refused) return { answer: message(await superValidate(adapter, { id }), refused.message, { status: refused.status }) };
		throw e;
	}
	const form = await superValidate(body, adapter, { id });
	if (!form.valid) return { answer: fail(400, { form }) };
	return { d, game, actor, form };
}

/** ?/upload: a new art asset from the page's form; on success, opens it. */
export async function uploadAction(event: ArtEvent) {
	const opened = await openArtForm(event, zod4(UploadFormSchema), 'upload');
	if ('answer' in opened) return opened.answer;
	const { d, game, actor, form } = opened;
	let assignment: ArtAssignment | null = null;
	if (form.data.place) {
		const parsed = ArtAssignmentSchema.safeParse(parsePlaceKey(form.data.place));
		if (!parsed.success) return message(form, 'Choose where the art prints from the list.', { status: 400 });
		assignment = parsed.data;
	}
	let outcome: UploadOutcome;
	try {
		const file = form.data.file;
		outcome = await uploadArt(d, actor, {
			bytes: new Uint8Array(await file.arrayBuffer()),
			fileName: file.name,
			status: form.data.status,
			assignment
		});
	} catch (e) {
		const refused = answerFor(e);
		if (refused) return message(form, `Nothing was stored. ${refused.message}`, { status: refused.status });
		throw e;
	}
	// The page opens the new art and says what happened, displaced slot holders included.
	const took = outcome.displaced.map((a) => `&took=${encodeURIComponent(a.id)}`).join('');
	redirect(303, `/games/${game.id}/art?art=${encodeURIComponent(outcome.art.id)}&uploaded=1${took}`);
}

/** ?/replace: a new file for an existing asset; the earlier file stays in its history. */
export async function replaceAction(event: ArtEvent) {
	const opened = await openArtForm(event, zod4(ReplaceFormSchema), 'replace');
	if ('answer' in opened) return opened.answer;
	const { d, actor, form } = opened;
	const { file, artId, version, status } = form.data;
	try {
		const outcome = await uploadArt(d, actor, {
			bytes: new Uint8Array(await file.arrayBuffer()),
			fileName: file.name,
			status: status === 'keep' ? undefined : status,
			replaces: { artId, version }
		});
		// The form now stands for the new version, so a second replace is checked against it.
		form.data.version = outcome.art.version!;
		return message(
			form,
			`Replaced. “${outcome.art.fileName}” is version ${outcome.version.number}; the earlier files stay in the history below.`
		);
	} catch (e) {
		const refused = answerFor(e);
		if (refused) return message(form, `Nothing was replaced. ${refused.message}`, { status: refused.status });
		throw e;
	}
}

/** ?/save: status and assignment of one asset. */
export async function placeAction(event: ArtEvent) {
	const d = await db();
	const { actor } = await requireGameRole(d, event.locals, event.params.gameId, 'art.edit');
	const form = await superValidate(event.request, zod4(ArtPlacementSchema), { id: 'placement' });
	if (!form.valid) return fail(400, { form });
	try {
		const { art, displaced, game: after } = await placeArt(d, actor, form.data);
		const where = art.assignment ? `It prints on ${describeAssignment(after, art.assignment)}.` : 'It is not assigned to a slot.';
		// The form stands for the piece as saved, so the next save is checked against its new version.
		form.data = { id: art.id, status: art.status, assignment: art.assignment ?? null, version: art.version };
		form.message = `Saved. ${where}${displacedNote(displaced)}`;
		return { form, game: after };
	} catch (e) {
		const refused = answerFor(e);
		if (refused) return message(form, refused.message, { status: refused.status });
		throw e;
	}
}

/* ------------------------------------------------------------- history */
