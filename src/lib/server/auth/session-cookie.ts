/**
 * The session cookie's encryption, kept from costing every request. Auth.js decrypts the cookie
 * on every request and encrypts a fresh one for the answer, each time deriving its key again: a
 * dozen steps on the thread pool, every one of which waits its turn behind whatever else the
 * server is doing (a burst of print jobs made a plain `/api/v1/me` wait ~100 ms for them).
 *
 * Here the format and the cryptography stay Auth.js's own (`@auth/core/jwt`); two things are kept:
 * - a cookie this process has decrypted, with what it says, until it expires (by its own `exp`);
 * - the cookie itself, which is answered back unchanged while it is younger than
 *   `REISSUE_AFTER_S` and says the same, instead of a new encryption of the same words.
 *
 * Whether the session is still open is not cached: the `jwt` callback asks the database on every
 * request, so a sign-out or a password change ends the cookie at once.
 */
import { decode as decrypt, encode as encrypt, type JWT, type JWTDecodeParams, type JWTEncodeParams } from '@auth/core/jwt';
import { LRUCache } from 'lru-cache';

/** A session cookie is re-encrypted (its expiry moved on) at most this often. */
export const REISSUE_AFTER_S = 60 * 60;

/** Cookies remembered at once: a small team's sessions, many times over. */
const REMEMBERED = 5_000;

interface Known {
	claims: JWT;
	/** The claims as one string, to tell an unchanged token from a changed one. */
	said: string;
}

/** Decrypted cookies by their text. */
const byCookie = new LRUCache<string, Known>({ max: REMEMBERED });
/** The cookie each token id came in, to answer it back unchanged. */
const cookieById = new LRUCache<string, string>({ max: REMEMBERED });

const nowS = () => Math.floor(Date.now() / 1000);

/** The claims as a string with its keys in order, so two equal tokens say the same. */
function say(claims: JWT): string {
	return JSON.stringify(Object.keys(claims).sort().map((k) => [k, claims[k]]));
}

/** Tells what keys the cookie was made with, so one made under another secret is never taken from memory. */
function keyed(params: { secret: string | string[]; salt: string }, cookie: string): string {
	return `${JSON.stringify([params.secret, params.salt])}\u0000${cookie}`;
}

export async function decodeSessionCookie(params: JWTDecodeParams): Promise<JWT | null> {
	if (!params.token) return null;
	const key = keyed(params, params.token);
	const known = byCookie.get(key);
	if (known && typeof known.claims.exp === 'number' && known.claims.exp > nowS()) return structuredClone(known.claims);
	const claims = await decrypt(params);
	if (!claims) return null;
	byCookie.set(key, { claims: structuredClone(claims), said: say(claims) });
	if (typeof claims.jti === 'string') cookieById.set(keyed(params, claims.jti), params.token);
	return claims;
}

export async function encodeSessionCookie(params: JWTEncodeParams): Promise<string> {
	const token = params.token;
	const young = typeof token?.iat === 'number' && nowS() - token.iat < REISSUE_AFTER_S;
	if (token && young && typeof token.jti === 'string') {
		const cookie = cookieById.get(keyed(params, token.jti));
		const known = cookie === undefined ? undefined : byCookie.get(keyed(params, cookie));
		if (cookie !== undefined && known?.said === say(token)) return cookie;
	}
	return encrypt(params);
}
