/** The game's settings in the History tab: a save shows as a version of "Game settings", and an earlier one comes back. */
import { test, expect } from '@playwright/test';
import { hydrated, signIn, demoGameId } from './helpers';

const SHOTS = process.env.E2E_SHOTS;

test('a designer renames the rogue runner, finds the settings in History and restores the version before', async ({ page }) => {
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	const { game } = await (await page.request.get(`/api/v1/games/${gameId}`)).json();
	const rogue = game.rogueRunner;
	const saved = await page.request.put(`/api/v1/games/${gameId}/settings`, {
		data: { rogueRunner: { ...rogue, version: undefined, name: 'Rogue renamed for history' }, version: rogue.version },
		headers: { origin: new URL(page.url()).origin }
	});
	expect(saved.status(), await saved.text()).toBe(200);

	await page.goto(`/games/${gameId}/history`);
	await hydrated(page);
	const link = page.getByTestId('history').getByRole('link', { name: 'Game settings' }).first();
	await expect(link).toBeVisible();
	await link.click();
	await hydrated(page);
	await expect(page.getByRole('heading', { name: 'History of the game settings' })).toBeVisible();
	const versions = page.getByTestId('versions');
	await expect(versions).toContainText('rogueRunner.name');
	await versions.getByRole('button', { name: `Restore version ${rogue.version}` }).click();
	await expect(page.getByTestId('restored')).toContainText(`Version ${rogue.version} is restored`);
	if (SHOTS) await page.screenshot({ path: `${SHOTS}/settings-history.png`, fullPage: true });
	const after = await (await page.request.get(`/api/v1/games/${gameId}`)).json();
	expect(after.game.rogueRunner.name).toBe(rogue.name);
});
