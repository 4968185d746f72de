/**
 * POST /api/v1/games/{gameId}/art/upload: an art file as the multipart field `file`, or as the
 * raw body named by `x-file-name` (fields then as query parameters). Fields: status, scope +
 * targetId + slot (assign it), or replaces + version (a new file for an existing asset; its
 * earlier files stay in the history). 201 for new art, 200 for a replaced file; every refusal
 * stores nothing. The asset's JSON itself is read and changed at …/art and …/art/{id}.
 */
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { requireGameRole } from '$lib/server/http/guard';
import { uploadArt } from '$lib/server/art-uploads';
import { readApiUpload } from '$lib/server/http/art-uploads';
import { artPrintChecks } from '$lib/art/placement';
import { MIN_PRINT_DPI } from '$lib/game/art-check';
import { loadFonts } from '$lib/print/fonts';
import { db } from '$lib/server/runtime';

export const POST: RequestHandler = api(async ({ locals, params, request, url }) => {
	const d = await db();
	const { actor } = await requireGameRole(d, locals, params.gameId, 'art.edit');
	const upload = await readApiUpload(request, url);
	const outcome = await uploadArt(d, actor, upload);
	const check = artPrintChecks(outcome.game, await loadFonts()).get(outcome.art.id)!;
	const worst = check.worst;
	return json(
		{
			art: outcome.art,
			version: outcome.version,
			displaced: outcome.displaced.map((a) => a.id),
			print: {
				basis: check.basis,
				// SVG is drawn at print resolution whatever its own size.
				vector: outcome.art.mime === 'image/svg+xml',
				...(check.note && { note: check.note }),
				...(worst && {
					where: `${worst.kindName}${worst.cardName ? ` “${worst.cardName}”` : ''} ${worst.side}`,
					slotMm: worst.slotMm,
					dpi: Math.floor(worst.resolution.dpi),
					ok: worst.resolution.ok,
					minDpi: MIN_PRINT_DPI,
					neededPx: worst.resolution.neededPx,
					warnings: worst.resolution.warnings
				})
			}
		},
		{ status: outcome.replaced ? 200 : 201 }
	);
});
