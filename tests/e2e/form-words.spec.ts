/**
 * Forms say what to do in plain words: a card left incomplete names the field in words in the
 * preview and in the form, never a schema path ("data.steps") or the validation library's wording.
 */
import { test, expect } from '@playwright/test';
import { signIn, demoGameId, hydrated } from './helpers';

const LIBRARY_WORDS = /data\.|params\.|Too small|Too big|Invalid input|expected (string|number)/;

test('an incomplete card says which field to fill, in words, in its preview and its form', async ({ page }) => {
	test.setTimeout(120_000);
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/kinds/kd-movement`);
	await hydrated(page);
	const main = page.getByRole('main');
	await page.getByRole('spinbutton', { name: /^Steps forward/ }).fill('');
	await expect(page.getByText('The card is not complete yet. Steps: Enter a number.')).toBeVisible();
	await page.getByRole('button', { name: 'Save the card' }).click();
	await expect(main.getByText('Enter a number.').first()).toBeVisible();
	expect(await main.innerText()).not.toMatch(LIBRARY_WORDS);
});
