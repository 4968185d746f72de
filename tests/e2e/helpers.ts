import { expect, type Browser, type BrowserContextOptions, type Page } from '@playwright/test';

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

/**
 * A person signed in in a browser of their own (a new context: no cookie or answer shared with any
 * other page). Close it with `page.context().close()`.
 */
export async function signInNewBrowser(browser: Browser, email: string, options: BrowserContextOptions = {}): Promise<Page> {
	const page = await (await browser.newContext(options)).newPage();
	await signIn(page, email);
	return page;
}

/** The demo game's id (other tests add games of their own to the demo team). */
export async function demoGameId(page: Page): Promise<string> {
	const me = await (await page.request.get('/api/v1/me')).json();
	const list = await (await page.request.get(`/api/v1/teams/${me.memberships[0].teamId}/games`)).json();
	const demo = list.games.find((g: { name: string }) => g.name === 'The Marrowbed Derby');
	if (!demo) throw new Error('the demo game is missing');
	return demo.id as string;
}
