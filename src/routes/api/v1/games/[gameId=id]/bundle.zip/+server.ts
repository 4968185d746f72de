import type { RequestHandler } from './$types';
import { api } from '$lib/server/http/api';
import { requireGameRole } from '$lib/server/http/guard';
import { exportBundle } from '$lib/server/game-io';
import { logActivity } from '$lib/server/activity';
import { db } from '$lib/server/runtime';

export const GET: RequestHandler = api(async ({ locals, params }) => {
	const d = await db();
	const { user, game } = await requireGameRole(d, locals, params.gameId, 'game.read');
	const { zip } = await exportBundle(d, params.gameId);
	await logActivity(d, { teamId: game.teamId, gameId: game.id, userId: user.id, action: 'game.exported' });
	return new Response(Buffer.from(zip), {
		headers: {
			'content-type': 'application/zip',
			'content-disposition': `attachment; filename="${game.slug}.paddock.zip"`
		}
	});
});
