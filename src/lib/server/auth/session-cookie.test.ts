import { describe, expect, it, vi, afterEach } from 'vitest';
import { decode, encode } from '@auth/core/jwt';
import { decodeSessionCookie, encodeSessionCookie, REISSUE_AFTER_S } from './session-cookie';

/**
 * The cookie stays Auth.js's own format: Auth.js's `decode` (the reference) reads what we write,
 * and we read what it writes. Remembering a cookie must never accept one Auth.js would refuse.
 */
const secret = 'a-test-secret-that-is-long-enough-0123456789';
const salt = 'authjs.session-token';
const claims = { sub: 'u1', sid: 's1', name: 'Ada', email: 'ada@example.test' };

afterEach(() => vi.useRealTimers());

describe('session cookie', () => {
	it("reads Auth.js's cookies, and Auth.js reads ours", async () => {
		const theirs = await encode({ token: claims, secret, salt });
		expect(await decodeSessionCookie({ token: theirs, secret, salt })).toMatchObject(claims);
		const ours = await encodeSessionCookie({ token: claims, secret, salt });
		expect(await decode({ token: ours, secret, salt })).toMatchObject(claims);
	});

	it('answers a young, unchanged cookie back as it came; a changed one is encrypted anew', async () => {
		const cookie = await encode({ token: claims, secret, salt });
		const read = (await decodeSessionCookie({ token: cookie, secret, salt }))!;
		expect(await encodeSessionCookie({ token: { ...read }, secret, salt })).toBe(cookie);
		const renamed = await encodeSessionCookie({ token: { ...read, name: 'Ada L.' }, secret, salt });
		expect(renamed).not.toBe(cookie);
		expect(await decode({ token: renamed, secret, salt })).toMatchObject({ name: 'Ada L.' });
	});

	it('re-encrypts a cookie older than the re-issue age, moving its expiry on', async () => {
		const cookie = await encode({ token: claims, secret, salt });
		const read = (await decodeSessionCookie({ token: cookie, secret, salt }))!;
		vi.useFakeTimers({ now: Date.now() + (REISSUE_AFTER_S + 5) * 1000, toFake: ['Date'] });
		const fresh = await encodeSessionCookie({ token: { ...read }, secret, salt });
		expect(fresh).not.toBe(cookie);
		expect((await decode({ token: fresh, secret, salt }))!.exp).toBeGreaterThan(read.exp as number);
	});

	it('refuses a cookie altered in transit, made with another secret, or expired, even after reading it once', async () => {
		const cookie = await encode({ token: claims, secret, salt, maxAge: 60 });
		await decodeSessionCookie({ token: cookie, secret, salt });
		const parts = cookie.split('.');
		parts[3] = parts[3].slice(0, -2) + (parts[3].endsWith('AA') ? 'BB' : 'AA');
		await expect(decodeSessionCookie({ token: parts.join('.'), secret, salt })).rejects.toThrow();
		await expect(decodeSessionCookie({ token: cookie, secret: 'another-secret-also-long-enough-0123456789', salt })).rejects.toThrow();
		vi.useFakeTimers({ now: Date.now() + 10 * 60 * 1000, toFake: ['Date'] });
		await expect(decodeSessionCookie({ token: cookie, secret, salt })).rejects.toThrow();
	});

	it('hands out a copy: changing the claims of one request does not change the next', async () => {
		const cookie = await encode({ token: claims, secret, salt });
		const first = (await decodeSessionCookie({ token: cookie, secret, salt }))!;
		first.name = 'Mallory';
		expect((await decodeSessionCookie({ token: cookie, secret, salt }))!.name).toBe('Ada');
	});
});
