/**
 * An attacker with an account of their own tries to read another person's reset link: they make
 * a team, invite the designer, ask a reset for the designer's address, and look through every page
 * they can reach. Caught mail shows to its recipient only, so the link never appears.
 */
import { test, expect, type Page } from '@playwright/test';
import { hydrated, signInNewBrowser } from './helpers';

const VICTIM = 'designer@paddock.test';

async function pageText(page: Page, path: string) {
	await page.goto(path);
	return (await page.content()) + (await page.locator('body').innerText());
}

test('a self-registered owner never sees the reset link of a person they invited', async ({ page, browser }) => {
	const attacker = `mallory-${Date.now()}@elsewhere.test`;
	await page.goto('/signup');
	await hydrated(page);
	await page.getByLabel('Your name').fill('Mallory');
	await page.getByLabel('E-mail').fill(attacker);
	await page.getByLabel('Password').fill('a-long-attacker-pass');
	await page.getByRole('button', { name: 'Make the account' }).click();
	await expect(page).toHaveURL('/');

	await page.goto('/teams/new');
	await hydrated(page);
	await page.getByLabel('Team name').fill('Lookalike Games');
	await page.getByRole('button', { name: 'Make the team' }).click();
	await expect(page.getByRole('heading', { name: 'Lookalike Games' })).toBeVisible();
	await page.getByRole('link', { name: 'Members' }).click();
	await expect(page.getByTestId('members')).toBeVisible();
	await hydrated(page);
	await page.getByLabel('E-mail').fill(VICTIM);
	await page.locator('form select[name=role]').selectOption('designer');
	await page.getByRole('button', { name: 'Send the invitation' }).click();
	await expect(page.getByRole('status')).toContainText(`Invitation sent to ${VICTIM}`);
	const teamPath = new URL(page.url()).pathname;

	// The reset is asked anonymously, from a browser with no session.
	const anon = await browser.newContext();
	const forgot = await anon.newPage();
	await forgot.goto('/forgot');
	await hydrated(forgot);
	await forgot.getByLabel('E-mail').fill(VICTIM);
	await forgot.getByRole('button', { name: 'Send the link' }).click();
	await expect(forgot.getByText('a reset link is on its way')).toBeVisible();
	await anon.close();

	// The victim does get the link, on their own page (so the mail was caught by now).
	const victim = await signInNewBrowser(browser, VICTIM);
	let resetPath = '';
	await expect(async () => {
		await victim.goto('/mail');
		const message = victim.getByTestId('mail').filter({ hasText: '/reset/' }).first();
		await expect(message).toBeVisible({ timeout: 1000 });
		resetPath = new URL((await message.getByRole('link').first().getAttribute('href'))!).pathname;
	}).toPass({ timeout: 20_000 });
	expect(resetPath).toMatch(/^\/reset\/\S+/);
	await victim.context().close();

	// Nowhere the attacker can go shows it, nor any mail to the victim.
	for (const path of ['/mail', '/', teamPath, '/account']) {
		const text = await pageText(page, path);
		expect(text, path).not.toContain(resetPath);
		expect(text, path).not.toContain('/reset/');
	}
	await page.goto('/mail');
	await expect(page.getByTestId('mail-owner')).toHaveText(attacker);
	for (const to of await page.getByTestId('mail-to').allInnerTexts()) expect(to).toContain(attacker);
});
