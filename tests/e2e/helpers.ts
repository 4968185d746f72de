import { expect, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'paddock-demo';

/** Waits until SvelteKit has hydrated the page, so clicks reach our handlers. */
export async function hydrated(page: Page) {
	await page.waitForFunction(() => document.documentElement.dataset.ready === 'yes');
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
	await page.goto('/signin');
	await hydrated(page);
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL('/');
}
