/**
 * Control characters in form posts (not only JSON bodies) answer a clear 400 naming the field,
 * checked once for every request by the form-text hook, and nothing is stored. Tab and line
 * breaks stay allowed. The database's own refusal of NUL (PostgreSQL: "invalid byte sequence"
 * / "unsupported Unicode escape sequence") would otherwise surface as a 500.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { isActionFailure, isHttpError, isRedirect, type RequestEvent } from '@sveltejs/kit';
import { Jimp } from 'jimp';
import { count, eq } from 'drizzle-orm';
import { openWorld, fakeEvent, superformJson, type World } from './harness';
import { refuseControlCharacters } from '$lib/server/http/form-text';
import { loadGame } from '$lib/server/game-store';
import { teams, artFiles } from '$lib/server/db/schema';
import * as newTeamPage from '../../src/routes/(app)/teams/new/+page.server';
import * as runnersPage from '../../src/routes/(app)/games/[gameId=id]/runners/+page.server';
import * as uploadApi from '../../src/routes/api/v1/games/[gameId=id]/art/upload/+server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

/** Runs a handler behind the hook, as the server does; the status it amounts to and any message. */
async function throughHook(event: ReturnType<typeof fakeEvent>, handler: (e: RequestEvent) => unknown): Promise<{ status: number; message?: string }> {
	// As a browser sends a form: its length declared.
	const body = await event.request.arrayBuffer();
	const headers = new Headers(event.request.headers);
	headers.set('content-length', String(body.byteLength));
	event.request = new Request(event.request.url, { method: event.request.method, headers, body });
	try {
		const response = await refuseControlCharacters({
			event: event as unknown as RequestEvent,
			resolve: async (e) => {
				const result = await handler(e);
				if (result instanceof Response) return result;
				return new Response(null, { status: isActionFailure(result) ? result.status : 200 });
			}
		});
		const body = response.headers.get('content-type')?.includes('json') ? await response.json() : null;
		return { status: response.status, message: body?.error?.message };
	} catch (e) {
		if (isHttpError(e)) return { status: e.status, message: e.body.message };
		if (isRedirect(e)) return { status: e.status };
		throw e;
	}
}

const teamCount = async () => (await w.db.select({ n: count() }).from(teams))[0].n;

describe('control characters in form posts', () => {
	it('a plain form field with NUL → 400 naming the field; no team made', async () => {
		const before = await teamCount();
		const out = await throughHook(fakeEvent(w.callers.owner, { form: { name: 'Bad\u0000Team' } }), newTeamPage.actions.default as never);
		expect(out).toEqual({ status: 400, message: 'name: text may not contain control characters (tab and line breaks aside)' });
		expect(await teamCount()).toBe(before);
	});

	it('a field inside a form posted as one serialised value → 400 naming it; the runner unchanged', async () => {
		const game = await loadGame(w.db, w.gameId);
		const runner = game.runners[0];
		const out = await throughHook(
			fakeEvent(w.callers.owner, { params: { gameId: w.gameId }, form: superformJson({ ...runner, name: 'Red\u001b[31m' }) }),
			runnersPage.actions.save as never
		);
		expect(out.status).toBe(400);
		expect(out.message).toMatch(/^name: text may not contain control characters/);
		const after = await loadGame(w.db, w.gameId);
		expect(after.runners[0]).toEqual(runner);
		expect(after.version).toBe(game.version);
	});

	it('an uploaded file whose name holds a control character → 400 from the API; nothing stored', async () => {
		// Small enough to be read whole by the hook; the upload's own reader checks larger ones (below).
		const before = (await w.db.select({ n: count() }).from(artFiles))[0].n;
		const png = await new Jimp({ width: 8, height: 8, color: 0x3f7d5aff }).getBuffer('image/png');
		const out = await throughHook(
			fakeEvent(w.callers.owner, { params: { gameId: w.gameId }, form: { file: new File([new Uint8Array(png)], 'bad\u0000name.png', { type: 'image/png' }) } }),
			uploadApi.POST as never
		);
		expect(out.status).toBe(400);
		expect(out.message).toMatch(/^file \(the file name\): text may not contain control characters/);
		expect((await w.db.select({ n: count() }).from(artFiles))[0].n).toBe(before);
	});

	it('tab and line breaks pass: the form is read as sent', async () => {
		const out = await throughHook(fakeEvent(w.callers.owner, { form: { name: 'Two\tColumns' } }), newTeamPage.actions.default as never);
		expect(out.status).toBe(303);
		expect(await w.db.select().from(teams).where(eq(teams.name, 'Two\tColumns'))).toHaveLength(1);
	});
});

describe('a file upload too large to copy', () => {
	it('its reader refuses a control character in a field', async () => {
		const before = (await w.db.select({ n: count() }).from(artFiles))[0].n;
		const png = await new Jimp({ width: 8, height: 8, color: 0x3f7d5aff }).getBuffer('image/png');
		// Declared larger than a text form: the hook leaves the body to the upload's reader.
		const event = fakeEvent(w.callers.owner, { params: { gameId: w.gameId }, form: { file: new File([new Uint8Array(png)], 'fine.png', { type: 'image/png' }), status: 'final\u0008' } });
		const res = await refuseControlCharacters({ event: event as unknown as RequestEvent, resolve: (e) => uploadApi.POST(e as never) });
		expect(res.status).toBe(400);
		expect((await res.json()).error.message).toMatch(/^status: text may not contain control characters/);
		expect((await w.db.select({ n: count() }).from(artFiles))[0].n).toBe(before);
	});
});
