import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { SettingsRequestSchema } from '$lib/server/http/requests';
import { api, readJson } from '$lib/server/http/api';
import { requireGameRole } from '$lib/server/http/guard';
import { saveSettings } from '$lib/server/game-store';
import { db } from '$lib/server/runtime';

/** Game-wide settings: the rogue runner. `version` is the settings version the editor saw (0 if none). */
export const PUT: RequestHandler = api(async ({ locals, params, request }) => {
	const d = await db();
	const { actor } = await requireGameRole(d, locals, params.gameId, 'game.edit');
	const body = await readJson(request, SettingsRequestSchema);
	const { version, ...settings } = body;
	const saved = await saveSettings(d, actor, { settings, baseVersion: version });
	// The settings as written and their version, for the next save's check.
	const { rogueRunner, raceRules } = saved.game;
	return json({ ok: true, settings: { ...(rogueRunner ? { rogueRunner } : {}), ...(raceRules ? { raceRules } : {}) }, version: saved.version });
});
