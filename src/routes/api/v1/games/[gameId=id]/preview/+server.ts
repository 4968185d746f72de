import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { api, readJson } from '$lib/server/http/api';
import { requireGameRole } from '$lib/server/http/guard';
import { loadGame } from '$lib/server/game-store';
import { renderFace } from '$lib/server/faces';
import { db } from '$lib/server/runtime';
import { PreviewRequestSchema } from '$lib/server/http/requests';
import type { ApiAnswer, CardPreviewSchema } from '$lib/schemas/api';
import { Invalid } from '$lib/server/refusals';


/** Live preview: lays out the editor's unsaved kind and card against the saved game. Writes nothing. */
export const POST: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	await requireGameRole(d, locals, params.gameId, 'game.read');
	const input = await readJson(request, PreviewRequestSchema);
	if (input.card && input.card.data.type !== input.kind.type) {
		throw new Invalid(`A ${input.kind.type} card kind cannot show ${input.card.data.type} data`);
	}
	const game = await loadGame(d, params.gameId);
	const { svg, layout } = await renderFace({
		game,
		kind: input.kind,
		card: input.card,
		side: input.side,
		guides: input.guides ?? false,
		artUrl: (sha) => `/api/v1/games/${params.gameId}/art-files/${sha}`
	});
	return json({ svg, warnings: layout.warnings } satisfies ApiAnswer<typeof CardPreviewSchema>);
});
