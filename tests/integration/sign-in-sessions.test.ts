/**
 * Sign-in limits where the password is checked, sessions that end, and cookie flags, through the
 * app's real hooks (Auth.js included) with a cookie jar per browser.
 */
process.env.AUTH_SECRET ??= 'integration-test-secret-0123456789abcdef';
import { afterAll, beforeAll, afterEach, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { openWorld, fakeEvent, statusOf, type World } from './harness';
import { TestBrowser } from './through-hooks';
import { createUser, startPasswordReset, finishPasswordReset, changePassword, findUserByEmail } from '$lib/server/users';
import { MAX_PER_ACCOUNT, MAX_PER_ADDRESS } from '$lib/server/auth/throttle';
import { openSessions } from '$lib/server/auth/sessions';
import { config } from '$lib/server/config';
import * as signinPage from '../../src/routes/(auth)/signin/+page.server';
import * as accountPage from '../../src/routes/(app)/account/+page.server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

const saved = { ...config };
afterEach(() => Object.assign(config, saved));

async function person(password = 'a-long-enough-secret') {
	const email = `p-${randomUUID().slice(0, 8)}@people.test`;
	const user = await createUser(w.db, { email, name: 'Pat', password });
	return { email, password, user };
}

describe('sign-in limit where the password is checked', () => {
	it('direct posts to the credentials callback are refused past the per-account limit, the right password too', async () => {
		const p = await person();
		const b = new TestBrowser('198.51.100.7');
		for (let i = 0; i < MAX_PER_ACCOUNT; i++) {
			const a = await b.postCredentials(p.email, `wrong-${i}`);
			expect(a.status).toBe(302);
			expect(a.location).toContain('error=CredentialsSignin');
		}
		const refused = await b.postCredentials(p.email, 'wrong-again');
		expect(refused.status).toBe(429);
		expect(JSON.parse(refused.body).error.message).toMatch(/Too many failed sign-ins/);
		// From another address too: the account itself is limited.
		const right = await new TestBrowser('198.51.100.8').postCredentials(p.email, p.password);
		expect(right.status).toBe(429);
		expect(await b.whoAmI()).toBeNull();
		// The sign-in form counts the same failures and says so.
		const form = await statusOf(() =>
			signinPage.actions.default(fakeEvent(null, { form: { email: p.email, password: p.password } }) as never)
		);
		expect(form).toBe(429);
	});

	it('the per-address limit counts the configured header, so one proxy does not lock everyone out', async () => {
		config.clientIpHeader = 'x-forwarded-for';
		const proxy = '10.0.0.1';
		const guesser = new TestBrowser(proxy, undefined, { 'x-forwarded-for': '192.0.2.50' });
		for (let i = 0; i < MAX_PER_ADDRESS; i++) await guesser.postCredentials(`nobody-${i}@people.test`, 'guess');
		expect((await guesser.postCredentials('nobody-x@people.test', 'guess')).status).toBe(429);
		// A spoofed first entry does not help: the proxy's own (last) entry counts.
		const spoofer = new TestBrowser(proxy, undefined, { 'x-forwarded-for': '1.2.3.4, 192.0.2.50' });
		expect((await spoofer.postCredentials('nobody-y@people.test', 'guess')).status).toBe(429);
		// Someone else behind the same proxy signs in.
		const p = await person();
		const other = new TestBrowser(proxy, undefined, { 'x-forwarded-for': '192.0.2.51' });
		expect((await other.postCredentials(p.email, p.password)).status).toBe(302);
		expect(await other.whoAmI()).toBe(p.email);
	});
});

describe('sessions that end', () => {
	it('a cookie replayed after sign-out is worthless', async () => {
		const p = await person();
		const b = new TestBrowser();
		const signedIn = await b.postCredentials(p.email, p.password);
		expect(signedIn.status).toBe(302);
		expect(await b.whoAmI()).toBe(p.email);
		const stolen = new Map(b.jar);
		await b.signOut();
		expect(await b.whoAmI()).toBeNull();
		const replay = new TestBrowser();
		replay.jar = stolen;
		expect(await replay.whoAmI()).toBeNull();
	});

	it('a password reset ends every session; a change ends all but the one in use', async () => {
		const p = await person();
		const mine = new TestBrowser();
		const attacker = new TestBrowser('192.0.2.99');
		await mine.postCredentials(p.email, p.password);
		await attacker.postCredentials(p.email, p.password);
		expect(await attacker.whoAmI()).toBe(p.email);

		const reset = (await startPasswordReset(w.db, p.email))!;
		expect(await finishPasswordReset(w.db, reset.token, 'another-long-secret')).toBe(true);
		expect(await attacker.whoAmI()).toBeNull();
		expect(await mine.whoAmI()).toBeNull();

		await mine.postCredentials(p.email, 'another-long-secret');
		await attacker.postCredentials(p.email, 'another-long-secret');
		const me = await mine.request('/account');
		expect(await changePassword(w.db, { userId: p.user.id, current: 'another-long-secret', password: 'third-long-secret', keepSession: me.sessionId })).toBe(true);
		expect(await mine.whoAmI()).toBe(p.email);
		expect(await attacker.whoAmI()).toBeNull();
	});

	it('the account page lists open sessions and ends another one, never someone else’s', async () => {
		const p = await person();
		const here = new TestBrowser();
		const there = new TestBrowser('192.0.2.77');
		await here.postCredentials(p.email, p.password);
		await there.postCredentials(p.email, p.password);
		const mine = await here.request('/account');
		const theirs = await there.request('/account');
		const caller = { id: p.user.id, email: p.email, name: 'Pat' };
		const event = (form?: Record<string, string>) => {
			const e = fakeEvent(caller, form ? { form } : {});
			(e.locals as App.Locals).sessionId = mine.sessionId;
			return e as never;
		};
		const page = (await accountPage.load(event())) as { sessions: { id: string; current: boolean; address: string }[] };
		expect(page.sessions.map((s) => s.id).sort()).toEqual([mine.sessionId, theirs.sessionId].sort());
		expect(page.sessions.find((s) => s.current)?.id).toBe(mine.sessionId);
		expect(page.sessions.find((s) => !s.current)?.address).toBe('192.0.2.77');

		const outsider = await person();
		const outsiderEvent = fakeEvent({ id: outsider.user.id, email: outsider.email, name: 'O' }, { form: { id: theirs.sessionId! } });
		expect(await statusOf(() => accountPage.actions.endSession(outsiderEvent as never))).toBe(404);
		expect(await there.whoAmI()).toBe(p.email);

		expect(await statusOf(() => accountPage.actions.endSession(event({ id: theirs.sessionId! })))).toBe(200);
		expect(await there.whoAmI()).toBeNull();
		expect(await here.whoAmI()).toBe(p.email);
		expect((await openSessions(w.db, p.user.id)).map((s) => s.id)).toEqual([mine.sessionId]);
	});

	it('API tokens are separate: ending sessions leaves them working', async () => {
		const { createApiToken, userForToken } = await import('$lib/server/api-tokens');
		const p = await person();
		const { token } = await createApiToken(w.db, { userId: p.user.id, name: p.user.name }, { name: 'script' });
		const reset = (await startPasswordReset(w.db, p.email))!;
		await finishPasswordReset(w.db, reset.token, 'yet-another-secret');
		expect((await userForToken(w.db, token))?.id).toBe(p.user.id);
	});
});

describe('cookie flags', () => {
	const sessionCookie = (b: TestBrowser) => b.sets.filter((c) => c.name.endsWith('authjs.session-token') && c.value);

	it('on plain http: HttpOnly, SameSite=Lax, never Secure, also when the session is refreshed', async () => {
		config.origin = 'http://paddock.example';
		const p = await person();
		const b = new TestBrowser(undefined, 'http://paddock.example');
		await b.postCredentials(p.email, p.password);
		await b.whoAmI(); // refreshes the session cookie through the framework's cookies.set
		const sets = sessionCookie(b);
		expect(sets.length).toBeGreaterThanOrEqual(2);
		for (const c of b.sets) {
			expect(c.secure, c.name).toBe(false);
			expect(c.httpOnly, c.name).toBe(true);
			expect(c.sameSite, c.name).toBe('lax');
		}
		expect(await b.whoAmI()).toBe(p.email);
	});

	it('on https: Secure as well', async () => {
		config.origin = 'https://paddock.example';
		const p = await person();
		const b = new TestBrowser(undefined, 'https://paddock.example');
		await b.postCredentials(p.email, p.password);
		await b.whoAmI();
		expect(sessionCookie(b).length).toBeGreaterThanOrEqual(2);
		for (const c of b.sets) {
			expect(c.secure, c.name).toBe(true);
			expect(c.httpOnly, c.name).toBe(true);
			expect(c.sameSite, c.name).toBe('lax');
		}
		expect(await b.whoAmI()).toBe(p.email);
	});
});

void findUserByEmail;
