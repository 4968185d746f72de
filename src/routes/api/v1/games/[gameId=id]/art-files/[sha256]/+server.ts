import type { RequestHandler } from './$types';
import { api, ApiError } from '$lib/server/api';
import { requireGameRole } from '$lib/server/guard';
import { artHistory } from '$lib/server/game-io';
import { readArtFile, readArtThumbnail } from '$lib/server/art-files';
import { artFiles } from '$lib/server/db/schema';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/runtime';

/** An art file of this game (any version it has had), or its thumbnail with ?thumb=1. */
export const GET: RequestHandler = api(async ({ locals, params, url }) => {
	const d = await db();
	await requireGameRole(d, locals, params.gameId, 'game.read');
	const sha = params.sha256;
	const used = (await artHistory(d, params.gameId)).some((v) => v.sha256 === sha);
	if (!used) throw new ApiError(404, 'No such art file in this game');
	const [file] = await d.select().from(artFiles).where(eq(artFiles.sha256, sha));
	const thumb = url.searchParams.get('thumb') === '1';
	const { bytes, mime } = thumb ? await readArtThumbnail(sha) : { bytes: await readArtFile(sha), mime: undefined };
	return new Response(Buffer.from(bytes), {
		headers: {
			'content-type': mime ?? file.mime,
			// Content-addressed: the bytes behind this URL never change.
			'cache-control': 'private, max-age=31536000, immutable',
			'x-content-type-options': 'nosniff',
			...(file.mime === 'image/svg+xml' ? { 'content-security-policy': "default-src 'none'; style-src 'unsafe-inline'" } : {})
		}
	});
});
