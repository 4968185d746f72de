/**
 * Sign-in, password reset and sign-up do not tell a stranger which addresses have accounts: the
 * answers are the same and take about the same time, and sign-up clashes are limited per network.
 * The costly part of an answer is the password hash (argon2, tens of milliseconds), so sign-in and
 * sign-up are checked by counting hash operations, which machine load cannot blur; password reset
 * has no hash and is checked by interleaved median times with a loose bound.
 */
process.env.AUTH_SECRET ??= 'integration-test-secret-0123456789abcdef';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

const argon = vi.hoisted(() => ({ calls: 0 }));
vi.mock('@node-rs/argon2', async (original) => {
	const real = await original<typeof import('@node-rs/argon2')>();
	return {
		...real,
		hash: (...a: Parameters<typeof real.hash>) => (argon.calls++, real.hash(...a)),
		verify: (...a: Parameters<typeof real.verify>) => (argon.calls++, real.verify(...a))
	};
});
import { eq } from 'drizzle-orm';
import { openWorld, fakeEvent, statusOf, type World } from './harness';
import { TestBrowser } from './through-hooks';
import { caughtMail } from '$lib/server/db/schema';
import { MAX_PER_ADDRESS } from '$lib/server/auth/throttle';
import { withClient } from '$lib/server/auth/client-address';
import * as forgotPage from '../../src/routes/(auth)/forgot/+page.server';
import * as signupPage from '../../src/routes/(auth)/signup/+page.server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function timed(run: () => Promise<unknown>) {
	const t = performance.now();
	await run();
	return performance.now() - t;
}

/** Hash operations (argon2 hash or verify) that one call makes. */
async function hashesIn(run: () => Promise<unknown>) {
	const before = argon.calls;
	await run();
	return argon.calls - before;
}

/** Hash operations of two calls, each after a first call that warms any one-time hash. */
async function compareHashes(a: () => Promise<unknown>, b: () => Promise<unknown>) {
	await a();
	await b();
	return { known: await hashesIn(a), unknown: await hashesIn(b) };
}

/** Median times of two calls, interleaved so machine load hits both alike. */
async function compare(a: () => Promise<unknown>, b: () => Promise<unknown>, rounds = 7) {
	await a();
	await b();
	const ta: number[] = [];
	const tb: number[] = [];
	for (let i = 0; i < rounds; i++) {
		ta.push(await timed(a));
		tb.push(await timed(b));
	}
	return { known: median(ta), unknown: median(tb) };
}

describe('the same answer, in about the same time', () => {
	it('sign-in with a wrong password: known and unknown addresses', async () => {
		// Each from its own address and account, so no limit is reached.
		let n = 0;
		const attempt = (email: string) => () => new TestBrowser(`192.0.2.${++n}`).postCredentials(email, 'not-the-password');
		const { known, unknown } = await compareHashes(attempt('printer@paddock.test'), attempt('nobody-at-all@paddock.test'));
		expect(known).toBe(1);
		expect(unknown).toBe(known);
	});

	it('password reset: known and unknown addresses', async () => {
		const ask = (email: string) => () =>
			forgotPage.actions.default(fakeEvent(null, { form: { email } }) as never) as Promise<unknown>;
		const { known, unknown } = await compare(ask('artist@paddock.test'), ask('nobody-at-all@paddock.test'));
		// Both answers are a few milliseconds (no hash, mail goes out after the answer); a known
		// address adds one row. Allow 25 ms of machine noise on top of the factor of two.
		expect(unknown + 25).toBeGreaterThan(known / 2);
		expect(unknown).toBeLessThan(known * 2 + 25);
	});

	it('sign-up with a taken address: no faster than a free one, and the holder is told', async () => {
		let n = 0;
		const signUp = (email: () => string) => () =>
			withClient({ address: `198.51.100.${++n}`, userAgent: '' }, () =>
				signupPage.actions.default(fakeEvent(null, { form: { name: 'New', email: email(), password: 'a-long-new-secret' } }) as never)
			).catch(() => undefined); // a new account goes on to sign in, which needs the server
		let k = 0;
		const { known: taken, unknown: free } = await compareHashes(
			signUp(() => 'reviewer@paddock.test'),
			signUp(() => `fresh-${++k}-${Date.now()}@people.test`)
		);
		// A free address hashes the new password and signs in; a taken one hashes and checks too.
		expect(free).toBe(2);
		expect(taken).toBe(free);
		for (let i = 0; i < 50; i++) {
			const m = await w.db.select().from(caughtMail).where(eq(caughtMail.to, 'reviewer@paddock.test'));
			if (m.some((x) => x.subject.includes('tried to make'))) return;
			await new Promise((r) => setTimeout(r, 50));
		}
		throw new Error('the holder of the address was not told');
	});
});

describe('sign-up clashes are limited per network', () => {
	it('past the limit, sign-up answers 429 from that address only', async () => {
		const signUp = (address: string, email: string) =>
			withClient({ address, userAgent: '' }, () =>
				statusOf(() => signupPage.actions.default(fakeEvent(null, { form: { name: 'Sweep', email, password: 'a-long-new-secret' } }) as never))
			);
		for (let i = 0; i < MAX_PER_ADDRESS; i++) expect(await signUp('203.0.113.200', 'owner@paddock.test')).toBe(409);
		expect(await signUp('203.0.113.200', 'designer@paddock.test')).toBe(429);
		expect(await signUp('203.0.113.201', 'designer@paddock.test')).toBe(409);
	});
});
