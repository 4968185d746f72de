/**
 * Sign-in with Auth.js: e-mail and password (Credentials), sessions as signed JWT cookies that
 * name a row in the sessions table, so they can be ended. The sign-in limit and the password
 * check live together in `authorize`: the sign-in form and a direct post to Auth.js's
 * credentials callback both pass through it.
 */
import { SvelteKitAuth, CredentialsSignin } from '@auth/sveltekit';
import type { RequestEvent } from '@sveltejs/kit';
import Credentials from '@auth/sveltekit/providers/credentials';
import { z } from 'zod';
import { authSecret, secureCookies } from '../config';
import { db } from '../runtime';
import { findUserByEmail } from '../users';
import { checkPassword } from '../auth/passwords';
import { signInRefused, recordFailure, WINDOW_MS } from '../auth/throttle';
import { currentClient } from '../auth/client-address';
import { decodeSessionCookie, encodeSessionCookie } from '../auth/session-cookie';
import { SESSION_MAX_AGE_S, endSession, openSessionUser, startSession } from '../auth/sessions';

const credentials = z.object({ email: z.string().trim().email(), password: z.string().min(1).max(200) });

/** Too many failed sign-ins lately, for this account or from this address. */
export class SignInLimited extends CredentialsSignin {
	code = 'rate_limited';
}

export const SIGN_IN_LIMITED_MESSAGE = `Too many failed sign-ins. Wait ${WINDOW_MS / 60_000} minutes and try again, or reset your password.`;

export const { handle: authHandle, signIn, signOut } = SvelteKitAuth(async () => ({
	secret: authSecret(),
	trustHost: true,
	useSecureCookies: secureCookies(),
	session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_S },
	// Auth.js's own cookie format, decrypted once per process and re-encrypted at most hourly.
	jwt: { encode: encodeSessionCookie, decode: decodeSessionCookie },
	pages: { signIn: '/signin' },
	providers: [
		Credentials({
			credentials: { email: {}, password: {} },
			async authorize(raw) {
				const parsed = credentials.safeParse(raw);
				if (!parsed.success) return null;
				const d = await db();
				const { email, password } = parsed.data;
				const { address } = currentClient();
				if (await signInRefused(d, email, address)) throw new SignInLimited();
				const user = await findUserByEmail(d, email);
				if (!(await checkPassword(user?.passwordHash, password)) || !user) {
					await recordFailure(d, email, address);
					return null;
				}
				return { id: user.id, email: user.email, name: user.name };
			}
		})
	],
	callbacks: {
		async jwt({ token, user }) {
			const d = await db();
			if (user?.id) {
				token.sid = await startSession(d, user.id, currentClient());
				return token;
			}
			// Every later read: the session must still be open (null ends the cookie). The name and
			// address come from the same read, so the request needs no second look-up.
			const person = typeof token.sid === 'string' && token.sub ? await openSessionUser(d, token.sid, token.sub) : null;
			if (!person) return null;
			token.name = person.name;
			token.email = person.email;
			return token;
		},
		session({ session, token }) {
			if (token.sub) session.user.id = token.sub;
			if (typeof token.name === 'string') session.user.name = token.name;
			if (typeof token.email === 'string') session.user.email = token.email;
			if (typeof token.sid === 'string') session.sessionId = token.sid;
			return session;
		}
	},
	events: {
		async signOut(message) {
			const token = 'token' in message ? message.token : null;
			if (token?.sub && typeof token.sid === 'string') await endSession(await db(), token.sub, token.sid);
		}
	}
}));

/**
 * Signs in from our own form action (whose body superforms has read already): hands Auth.js a
 * fresh form request. Redirects on success; throws CredentialsSignin on a wrong password and
 * SignInLimited past the limit.
 */
export async function signInWithPassword(
	event: RequestEvent,
	input: { email: string; password: string; redirectTo: string }
): Promise<never> {
	const body = new FormData();
	body.set('providerId', 'credentials');
	body.set('email', input.email);
	body.set('password', input.password);
	body.set('redirectTo', input.redirectTo);
	const headers = new Headers(event.request.headers);
	headers.delete('content-type');
	headers.delete('content-length');
	const request = new Request(event.request.url, { method: 'POST', headers, body });
	await signIn({ ...event, request });
	throw new Error('Sign-in did not redirect');
}

export { CredentialsSignin };

/** Only paths of our own after sign-in, never another site. */
export function safeNext(value: string | null | undefined): string {
	return value && value.startsWith('/') && !value.startsWith('//') ? value : '/';
}
