import { test, expect } from '@playwright/test';
import { hydrated, signIn, demoGameId } from './helpers';

const SHOTS = process.env.E2E_SHOTS;
async function shot(page: import('@playwright/test').Page, name: string) {
	if (SHOTS) await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });
}

test('the owner duplicates the demo game in one click, then deletes the copy after typing its name', async ({ page }) => {
	test.setTimeout(120_000);
	await signIn(page, 'owner@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}`);
	await hydrated(page);
	await page.getByRole('button', { name: 'Duplicate the game' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('The Marrowbed Derby (copy)', { timeout: 60_000 });
	const copyId = new URL(page.url()).pathname.split('/')[2];
	expect(copyId).not.toBe(gameId);

	await page.getByRole('link', { name: 'Delete the game…' }).click();
	await hydrated(page);
	await expect(page.getByTestId('what-goes')).toContainText('cards');
	const confirm = page.getByLabel(/Type the game's name/);
	const button = page.getByRole('button', { name: 'Delete the game for good' });
	await confirm.fill('The Marrowbed Derby');
	await expect(button).toBeDisabled();
	await confirm.fill('The Marrowbed Derby (copy)');
	await expect(button).toBeEnabled();
	await shot(page, 'delete-confirmation');
	await button.click();
	await expect(page.getByTestId('game-deleted')).toContainText('The Marrowbed Derby (copy) was deleted');
	expect((await page.request.get(`/api/v1/games/${copyId}`)).status()).toBe(404);
	expect((await page.request.get(`/api/v1/games/${gameId}`)).status()).toBe(200);
});

test('a designer is offered no delete, and the delete page refuses them', async ({ page }) => {
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}`);
	await hydrated(page);
	await expect(page.getByRole('link', { name: 'Delete the game…' })).toHaveCount(0);
	const res = await page.goto(`/games/${gameId}/delete`);
	expect(res?.status()).toBe(403);
});
