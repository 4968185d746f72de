/**
 * Request hooks around Auth.js: who the client is, the cookie policy, and a plain 429 when a
 * direct post to the credentials callback is over the sign-in limit.
 */
import type { Handle } from '@sveltejs/kit';
import { config, secureCookies } from '../config';
import { addressFrom, withClient } from '../auth/client-address';
import { SIGN_IN_LIMITED_MESSAGE } from './authjs';
import { WINDOW_MS } from '../auth/throttle';
import { asBackground, backgroundTurn } from '../db/turns';

export const knowClient: Handle = ({ event, resolve }) =>
	withClient(
		{
			address: addressFrom(event.request.headers, config.clientIpHeader, () => event.getClientAddress()),
			userAgent: event.request.headers.get('user-agent') ?? ''
		},
		() => resolve(event)
	);

/** Requests that start print jobs: background work, whose database calls let a person's clicks go first. */
const STARTS_PRINT_JOB = '/api/v1/games/[gameId=id]/print-jobs';
/** Following a print job (its state, its event stream, its file): background work too. */
const FOLLOWS_PRINT_JOB = new Set(['/api/v1/print-jobs/[jobId=id]', '/api/v1/print-jobs/[jobId=id]/events', '/api/v1/print-jobs/[jobId=id]/file']);

function isBackgroundRequest(method: string, routeId: string | null) {
	return method === 'POST' ? routeId === STARTS_PRINT_JOB : method === 'GET' && routeId !== null && FOLLOWS_PRINT_JOB.has(routeId);
}

/**
 * Starting and following print jobs waits its turn behind everything else (../db/turns.ts): the
 * request starts on a background turn of its own, and its database calls take theirs.
 */
export const backgroundRequests: Handle = ({ event, resolve }) =>
	isBackgroundRequest(event.request.method, event.route.id)
		? asBackground(async () => {
				await backgroundTurn();
				return resolve(event);
			})
		: resolve(event);

/**
 * Every cookie: HttpOnly, SameSite=Lax, and Secure exactly when the origin is https. Auth.js
 * refreshes its session cookie through `cookies.set` without a `secure` option, which the
 * framework would otherwise turn on for any host but localhost, losing the session on plain http.
 */
export const cookiePolicy: Handle = ({ event, resolve }) => {
	const set = event.cookies.set.bind(event.cookies);
	event.cookies.set = (name, value, options) =>
		set(name, value, { ...options, secure: secureCookies(), httpOnly: true, sameSite: 'lax' });
	return resolve(event);
};

export const CREDENTIALS_CALLBACK = '/auth/callback/credentials';

export const signInLimitAnswer: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (event.url.pathname !== CREDENTIALS_CALLBACK) return response;
	const location = response.headers.get('location');
	if (!location || new URL(location, event.url).searchParams.get('code') !== 'rate_limited') return response;
	return new Response(JSON.stringify({ error: { code: 'rate_limited', message: SIGN_IN_LIMITED_MESSAGE } }), {
		status: 429,
		headers: { 'content-type': 'application/json', 'retry-after': String(WINDOW_MS / 1000) }
	});
};
