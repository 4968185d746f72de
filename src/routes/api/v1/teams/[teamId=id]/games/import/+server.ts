import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readBody } from '$lib/server/http/api';
import { requireRole } from '$lib/server/http/guard';
import { importBundle } from '$lib/server/game-io';
import { BundleError, MAX_BUNDLE_UNCOMPRESSED_BYTES } from '$lib/game/bundle';
import { db } from '$lib/server/runtime';
import { Invalid, Refusal } from '$lib/server/refusals';

/** A game bundle as the request body (application/zip) or as the `file` of a multipart form. */
export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { actor } = await requireRole(d, locals, params.teamId, 'game.create');
	let zip: Uint8Array;
	if ((request.headers.get('content-type') ?? '').startsWith('multipart/form-data')) {
		const declared = Number(request.headers.get('content-length') ?? 0);
		if (declared > MAX_BUNDLE_UNCOMPRESSED_BYTES) throw new Refusal('too-large', 'The bundle is too large');
		const file = (await request.formData()).get('file');
		if (!(file instanceof File)) throw new Invalid('Send the bundle as the form field "file"');
		zip = new Uint8Array(await file.arrayBuffer());
	} else {
		zip = await readBody(request, MAX_BUNDLE_UNCOMPRESSED_BYTES);
	}
	if (zip.byteLength === 0) throw new Invalid('The request has no bundle in it');
	try {
		const game = await importBundle(d, actor, { zip });
		return json({ id: game.id, name: game.name, slug: game.slug }, { status: 201 });
	} catch (e) {
		if (e instanceof BundleError) throw new Invalid(e.message, undefined, 'bad_bundle');
		throw e;
	}
});
