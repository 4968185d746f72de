/**
 * GET …/art-files/{sha256}: one art file (or its thumbnail with ?thumb=1). The working game's route
 * serves any version the game has had; a proof's route serves only the art its snapshot froze, so
 * a printer (who may read released proofs) sees the art the proof prints.
 */
import { eq } from 'drizzle-orm';
import { requireGameRole } from './guard';
import { requireProof } from './proof-access';
import { snapshotOf } from '../proofs';
import { artHistory } from '../game-io';
import { openArtFile } from '../art-files';
import { streamBody } from '../storage';
import { artFiles } from '../db/schema';
import type { Db } from '../db';
import { db } from '../runtime';
import { NotFound } from '../refusals';

async function artFileResponse(d: Db, sha: string, thumb: boolean) {
	const [file] = await d.select().from(artFiles).where(eq(artFiles.sha256, sha));
	if (!file) throw new NotFound('No such art file');
	// Streamed from the store as it is sent, never held whole in memory.
	const stored = await openArtFile(sha, thumb);
	return new Response(streamBody(stored), {
		headers: {
			'content-type': stored.thumbnail ? 'image/png' : file.mime,
			'content-length': String(stored.bytes),
			// Content-addressed: the bytes behind this URL never change.
			'cache-control': 'private, max-age=31536000, immutable',
			'x-content-type-options': 'nosniff',
			// Opened directly, a user's file runs nothing and loads nothing; an SVG downloads instead.
			'content-security-policy': "default-src 'none'; style-src 'unsafe-inline'",
			...(file.mime === 'image/svg+xml' && !stored.thumbnail
				? { 'content-disposition': `attachment; filename="${sha.slice(0, 12)}.svg"` }
				: {})
		}
	});
}

interface ArtEvent {
	locals: App.Locals;
	params: { gameId: string; sha256: string; proofId?: string };
	url: URL;
}

export async function gameArtFile({ locals, params, url }: ArtEvent) {
	const d = await db();
	await requireGameRole(d, locals, params.gameId, 'game.read');
	const used = (await artHistory(d, params.gameId)).some((v) => v.sha256 === params.sha256);
	if (!used) throw new NotFound('No such art file in this game');
	return artFileResponse(d, params.sha256, url.searchParams.get('thumb') === '1');
}

export async function proofArtFile({ locals, params, url }: ArtEvent) {
	const d = await db();
	const { proof } = await requireProof(d, locals, params.gameId, params.proofId!);
	if (!snapshotOf(proof).art.some((a) => a.sha256 === params.sha256)) throw new NotFound('No such art file in this proof');
	return artFileResponse(d, params.sha256, url.searchParams.get('thumb') === '1');
}
