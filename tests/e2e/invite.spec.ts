import { test, expect } from '@playwright/test';
import { hydrated, signIn } from './helpers';

test('the owner invites a member, who accepts from the e-mail in a second browser', async ({ page, browser }) => {
	const email = `guest-${Date.now()}@studio.test`;
	await signIn(page, 'owner@paddock.test');
	await page.getByRole('link', { name: 'Mossbank Games' }).first().click();
	await page.getByRole('link', { name: 'Members' }).click();
	await expect(page.getByTestId('members')).toBeVisible();
	await hydrated(page);
	await page.getByLabel('E-mail').fill(email);
	await page.locator('form select[name=role]').selectOption('reviewer');
	await page.getByRole('button', { name: 'Send the invitation' }).click();
	await expect(page.getByRole('status')).toContainText(`Invitation sent to ${email}`);

	// The owner cannot read it: caught mail shows to its own recipient only.
	await page.getByRole('link', { name: 'Caught mail' }).click();
	await expect(page.getByTestId('mail-owner')).toHaveText('owner@paddock.test');
	await expect(page.getByTestId('mail').filter({ hasText: email })).toHaveCount(0);

	// A second person, in a browser context of their own, makes an account with the invited
	// address and reads the invitation on their own caught-mail page.
	const other = await browser.newContext();
	const guest = await other.newPage();
	await guest.goto('/signup');
	await hydrated(guest);
	await guest.getByLabel('Your name').fill('Gale Tester');
	await guest.getByLabel('E-mail').fill(email);
	await guest.getByLabel('Password').fill('a-long-guest-pass');
	await guest.getByRole('button', { name: 'Make the account' }).click();
	await expect(guest).toHaveURL('/');
	await guest.getByRole('link', { name: 'Caught mail' }).click();
	const message = guest.getByTestId('mail').filter({ hasText: email }).first();
	await expect(message).toContainText('invites you to Mossbank Games');
	const link = await message.getByRole('link').first().getAttribute('href');
	expect(link).toMatch(/\/invite\/inv_/);
	await guest.goto(new URL(link!).pathname);
	await expect(guest.getByRole('heading', { name: 'Join Mossbank Games' })).toBeVisible();
	await hydrated(guest);
	await guest.getByRole('button', { name: 'Accept the invitation' }).click();
	await expect(guest.getByRole('heading', { name: 'Mossbank Games' })).toBeVisible();

	// The link works once.
	await guest.goto(new URL(link!).pathname);
	await expect(guest.getByText('used already')).toBeVisible();
	await other.close();

	// The owner sees the new member (the list comes from the API).
	await page.goto('/');
	await page.getByRole('link', { name: 'Mossbank Games' }).first().click();
	await page.getByRole('link', { name: 'Members' }).click();
	await expect(page.getByTestId('members')).toContainText('Gale Tester');
	await expect(page.getByTestId('members')).toContainText(email);
});
