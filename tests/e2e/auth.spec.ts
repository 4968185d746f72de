import { test, expect } from '@playwright/test';
import { hydrated, signIn } from './helpers';

const ROLES = ['owner', 'designer', 'artist', 'printer', 'reviewer'] as const;

test('a wrong password shows a clear message and no session', async ({ page }) => {
	await page.goto('/signin');
	await hydrated(page);
	await page.getByLabel('E-mail').fill('owner@paddock.test');
	await page.getByLabel('Password').fill('not-my-password');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('alert')).toContainText('do not match an account');
	const me = await page.request.get('/api/v1/me');
	expect(me.status()).toBe(401);
});

for (const role of ROLES) {
	test(`the demo ${role} signs in and the API knows their role`, async ({ page }) => {
		await signIn(page, `${role}@paddock.test`);
		await expect(page.getByRole('heading', { name: 'Your teams' })).toBeVisible();
		const me = await (await page.request.get('/api/v1/me')).json();
		expect(me.user.email).toBe(`${role}@paddock.test`);
		expect(me.memberships).toEqual([expect.objectContaining({ teamName: 'Mossbank Games', role })]);
	});
}

test('sign-out ends the session', async ({ page }) => {
	await signIn(page, 'artist@paddock.test');
	await page.getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/signin/);
	expect((await page.request.get('/api/v1/me')).status()).toBe(401);
});
