import type { Handle, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { authHandle } from '$lib/server/http/authjs';
import { knowClient, backgroundRequests, cookiePolicy, signInLimitAnswer } from '$lib/server/http/request-hooks';
import { startRuntime, db, StartupError } from '$lib/server/runtime';
import { userForToken } from '$lib/server/api-tokens';
import { apiError } from '$lib/server/http/api';
import { refuseControlCharacters } from '$lib/server/http/form-text';
import { DataDirLockedError } from '$lib/server/db/lock';
import '$lib/schemas/messages';
import { DatabaseUnreachableError } from '$lib/server/db';

export const init: ServerInit = async () => {
	try {
		await startRuntime();
	} catch (e) {
		if (e instanceof DataDirLockedError || e instanceof DatabaseUnreachableError || e instanceof StartupError) {
			console.error(`Paddock cannot start: ${e.message}`);
			process.exit(1);
		}
		throw e;
	}
};

const WRITES = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/**
 * Who is calling: an API token (`Authorization: Bearer …`) or the session cookie.
 * Cookie-authenticated writes to the JSON API must come from our own pages: SvelteKit checks
 * the origin of form posts only, so JSON writes are checked here.
 */
const identify: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	const isApi = event.url.pathname.startsWith('/api/');
	const bearer = event.request.headers.get('authorization')?.match(/^Bearer\s+(\S+)$/i)?.[1];
	if (bearer) {
		if (!isApi) return apiError(400, 'API tokens are accepted by /api/ routes only');
		event.locals.user = await userForToken(await db(), bearer);
		if (!event.locals.user) return apiError(401, 'This API token is unknown or revoked');
		event.locals.via = 'token';
	} else {
		// The session check (./lib/server/http/authjs.ts) read the person from the database just now.
		const session = await event.locals.auth();
		const user = session?.user;
		if (user?.id && user.email && typeof user.name === 'string') {
			event.locals.user = { id: user.id, email: user.email, name: user.name };
			event.locals.via = 'cookie';
			event.locals.sessionId = session?.sessionId;
		}
		if (isApi && WRITES.has(event.request.method) && event.locals.via === 'cookie') {
			const origin = event.request.headers.get('origin');
			const site = event.request.headers.get('sec-fetch-site');
			const sameOrigin = origin ? origin === event.url.origin : site === 'same-origin';
			if (!sameOrigin) return apiError(403, 'Cross-site requests are refused', 'cross_site');
		}
	}
	return resolve(event);
};

/** In order; exported so integration tests can run the same chain without the server. */
export const handlers: Handle[] = [knowClient, backgroundRequests, cookiePolicy, signInLimitAnswer, authHandle, identify, refuseControlCharacters];

export const handle = sequence(...handlers);
