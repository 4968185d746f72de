/**
 * Sign-in with Auth.js: e-mail and password (Credentials), sessions as signed JWT cookies.
 */
import { SvelteKitAuth, CredentialsSignin } from '@auth/sveltekit';
import type { RequestEvent } from '@sveltejs/kit';
import Credentials from '@auth/sveltekit/providers/credentials';
import { z } from 'zod';
import { authSecret } from '../config';
import { db } from '../runtime';
import { findUserByEmail } from '../users';
import { verifyPassword } from './passwords';

const credentials = z.object({ email: z.string().trim().email(), password: z.string().min(1) });

export const { handle: authHandle, signIn, signOut } = SvelteKitAuth(async () => ({
	secret: authSecret(),
	trustHost: true,
	session: { strategy: 'jwt', maxAge: 30 * 24 * 60 * 60 },
	pages: { signIn: '/signin' },
	providers: [
		Credentials({
			credentials: { email: {}, password: {} },
			async authorize(raw) {
				const parsed = credentials.safeParse(raw);
				if (!parsed.success) return null;
				const user = await findUserByEmail(await db(), parsed.data.email);
				if (!user || !(await verifyPassword(user.passwordHash, parsed.data.password))) return null;
				return { id: user.id, email: user.email, name: user.name };
			}
		})
	],
	callbacks: {
		session({ session, token }) {
			if (token.sub) session.user.id = token.sub;
			return session;
		}
	}
}));

/**
 * Signs in from our own form action (whose body superforms has read already): hands Auth.js a
 * fresh form request. Redirects on success; throws CredentialsSignin on a wrong password.
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
