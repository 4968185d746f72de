/**
 * Sessions end for real: a cookie copied before sign-out no longer works, and the account page
 * lists where the person is signed in and ends another browser's session.
 */
import { test, expect } from '@playwright/test';
import { signIn } from './helpers';

test('a session cookie copied before sign-out is refused after it', async ({ page, browser }) => {
	await signIn(page, 'artist@paddock.test');
	const copied = await page.context().cookies();
	expect(copied.find((c) => c.name.endsWith('authjs.session-token'))).toMatchObject({ httpOnly: true, sameSite: 'Lax', secure: false });
	await page.getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/signin/);

	const thief = await browser.newContext();
	await thief.addCookies(copied);
	expect((await thief.request.get('/api/v1/me')).status()).toBe(401);
	await thief.close();
});

test('the account page ends the session of another browser', async ({ page, browser }) => {
	const elsewhere = await browser.newContext({ userAgent: 'Elsewhere Browser/9' });
	const other = await elsewhere.newPage();
	await signIn(other, 'reviewer@paddock.test');
	expect((await other.request.get('/api/v1/me')).status()).toBe(200);

	await signIn(page, 'reviewer@paddock.test');
	await page.goto('/account');
	const rows = page.getByTestId('session');
	await expect(rows.filter({ hasText: 'this browser' })).toHaveCount(1);
	const theirs = rows.filter({ hasText: 'Elsewhere Browser/9' });
	await expect(theirs).toHaveCount(1);
	await page.screenshot({ path: 'test-results/account-sessions.png', fullPage: true });
	await theirs.getByRole('button', { name: 'End' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'One session ended.' })).toBeVisible();
	await expect(rows.filter({ hasText: 'Elsewhere Browser/9' })).toHaveCount(0);

	expect((await other.request.get('/api/v1/me')).status()).toBe(401);
	expect((await page.request.get('/api/v1/me')).status()).toBe(200);
	await elsewhere.close();
});
