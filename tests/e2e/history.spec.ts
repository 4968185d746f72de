import { test, expect } from '@playwright/test';
import { hydrated, signIn, demoGameId } from './helpers';

const SHOTS = process.env.E2E_SHOTS;
async function shot(page: import('@playwright/test').Page, name: string) {
	if (SHOTS) await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });
}

test("a designer sees a runner's versions, views the first and restores it as a new version", async ({ page }) => {
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	const { runners } = await (await page.request.get(`/api/v1/games/${gameId}/runners`)).json();
	const runner = runners[0];
	const saved = await page.request.put(`/api/v1/games/${gameId}/runners/${runner.id}`, {
		data: { ...runner, name: 'Renamed for history' },
		headers: { origin: new URL(page.url()).origin }
	});
	expect(saved.status()).toBe(200);

	await page.goto(`/games/${gameId}/history`);
	await hydrated(page);
	await expect(page.getByTestId('history')).toContainText('Renamed for history');
	await expect(page.getByTestId('history')).toContainText('name');
	await page.getByTestId('history').getByRole('link', { name: 'Renamed for history' }).first().click();
	await hydrated(page);
	const versions = page.getByTestId('versions');
	await expect(versions).toContainText(/now/);
	await versions.getByRole('link', { name: 'View version 1', exact: true }).click();
	await expect(page.getByTestId('viewed')).toContainText(runner.name);
	await expect(page.getByTestId('viewed')).toContainText('differs from now');
	await versions.getByRole('button', { name: 'Restore version 1' }).click();
	await expect(page.getByTestId('restored')).toContainText('Version 1 is restored');
	await expect(versions).toContainText('restored version 1');
	await shot(page, 'history-restore');
	const after = await (await page.request.get(`/api/v1/games/${gameId}/runners/${runner.id}`)).json();
	expect(after.runner.name).toBe(runner.name);
});
