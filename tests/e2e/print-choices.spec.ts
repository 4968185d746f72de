/** The print page shows the card whose press file its link downloads, before anyone picks one. */
import { test, expect } from '@playwright/test';
import { signIn, demoGameId, hydrated } from './helpers';

test('the press-file choice names the card the download link is for from the start', async ({ page }) => {
	test.setTimeout(120_000);
	await signIn(page, 'printer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/print`);
	await hydrated(page);
	const card = page.getByTestId('press-card');
	const first = await card.locator('option').first().getAttribute('value');
	expect(first).toBeTruthy();
	await expect(card).toHaveValue(first!);
	await expect(page.getByTestId('download-press')).toHaveAttribute('href', new RegExp(`/cards/${encodeURIComponent(first!).replace(/\./g, '\\.')}/press\\.pdf`));
	// Picking another card moves the link with it.
	const second = (await card.locator('option').nth(1).getAttribute('value'))!;
	await card.selectOption(second);
	await expect(card).toHaveValue(second);
	await expect(page.getByTestId('download-press')).toHaveAttribute('href', new RegExp(`/cards/${encodeURIComponent(second).replace(/\./g, '\\.')}/press\\.pdf`));
});
