import { test, expect } from '@playwright/test';
import { mkdirSync } from 'node:fs';
import { demoGameId, hydrated, signIn, signInNewBrowser } from './helpers';

const SHOTS = process.env.E2E_SHOTS ?? 'test-results/odds';

test('a designer runs the demo game’s saved scenario and sees the chart and the generous wager cards', async ({ page }) => {
	mkdirSync(SHOTS, { recursive: true });
	await page.setViewportSize({ width: 1280, height: 1000 });
	await signIn(page, 'designer@paddock.test');
	await page.getByRole('link', { name: 'Mossbank Games' }).first().click();
	await page.getByRole('link', { name: 'The Marrowbed Derby' }).click();
	await page.getByRole('navigation', { name: 'Game' }).getByRole('link', { name: 'Odds', exact: true }).click();
	await hydrated(page);
	await expect(page.getByText('A model of random play, not of good play.')).toBeVisible();
	// The saved scenarios are the start-of-stage positions the demo's money tables were priced on.
	await page.getByRole('button', { name: 'Stage 5: the final stretch' }).click();
	await expect(page.getByRole('list', { name: 'Cards still to come' }).getByRole('listitem')).toHaveCount(12);
	await page.screenshot({ path: `${SHOTS}/odds-before.png`, fullPage: true });

	await page.getByLabel(/Exact/).check();
	await page.getByRole('button', { name: 'Run', exact: true }).click();
	const result = page.getByTestId('odds-result');
	await expect(result).toBeVisible({ timeout: 60_000 });
	await expect(result.locator('canvas').first()).toBeVisible();
	await expect(result.getByText('Chance of each place when the stage ends')).toBeVisible();
	const flagged = result.locator('tr[data-generous="yes"]');
	expect(await flagged.count()).toBeGreaterThan(0);
	await expect(flagged.first().getByRole('link', { name: 'edit the table' })).toBeVisible();
	await page.screenshot({ path: `${SHOTS}/odds-after.png`, fullPage: true });
});

test('a long run shows its progress and can be cancelled; a printer may not run odds', async ({ page, browser }) => {
	await signIn(page, 'designer@paddock.test');
	await page.getByRole('link', { name: 'Mossbank Games' }).first().click();
	await page.getByRole('link', { name: 'The Marrowbed Derby' }).click();
	await page.getByRole('navigation', { name: 'Game' }).getByRole('link', { name: 'Odds', exact: true }).click();
	await hydrated(page);
	await page.getByLabel('Monte Carlo').check();
	await page.getByLabel('Samples').fill('10000000');
	await page.getByRole('button', { name: 'Run', exact: true }).click();
	await expect(page.getByText(/Running…/)).toBeVisible();
	await page.getByRole('button', { name: 'Cancel' }).click();
	await expect(page.getByRole('status')).toHaveText('Cancelled.');

	const gameId = await demoGameId(page);
	// The printer in a browser of their own, so no answer still coming to the designer's page signs them in again.
	const printer = await signInNewBrowser(browser, 'printer@paddock.test');
	const res = await printer.request.post(`/api/v1/games/${gameId}/odds`, { data: { finish: 5, stacks: [{ space: 1, bottomToTop: ['x'] }], deck: [], exact: true } });
	expect(res.status()).toBe(403);
	await printer.context().close();
});

test('a reviewer sees each wager card’s expected coins at the time of the proof', async ({ page }) => {
	await signIn(page, 'reviewer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/proofs/1`);
	await hydrated(page);
	const panel = page.getByTestId('proof-wager-prices');
	await panel.getByText('Wager cards at this proof: expected coins').click();
	await expect(panel.getByText(/whole races of this proof's data/)).toBeVisible({ timeout: 60_000 });
	expect(await panel.locator('tbody tr').count()).toBeGreaterThan(10);
	await panel.screenshot({ path: `${SHOTS}/proof-prices.png` });
});
