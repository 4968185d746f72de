import { test, expect } from '@playwright/test';
import { hydrated, signIn, demoGameId } from './helpers';

test("a printer's first-sheet preview of the released proof shows its art", async ({ page }) => {
	await signIn(page, 'printer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/print`);
	await hydrated(page);
	const preview = page.getByTestId('sheet-preview');
	await expect(preview).toBeVisible({ timeout: 30_000 });
	const hrefs = await preview.locator('image').evaluateAll((els) =>
		els.map((e) => e.getAttribute('href') ?? e.getAttribute('xlink:href') ?? '').filter((h) => h.includes('/art-files/'))
	);
	expect(hrefs.length).toBeGreaterThan(0);
	for (const href of new Set(hrefs)) {
		expect(href).toContain('/proofs/');
		expect((await page.request.get(href)).status()).toBe(200);
	}
});

const SHOTS = process.env.E2E_SHOTS;
async function shot(page: import('@playwright/test').Page, name: string) {
	if (SHOTS) await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });
}

test('a new runner saves with a warning linking to the table it leaves short; the readiness list names it', async ({ page }) => {
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/runners?new`);
	await hydrated(page);
	await expect(page.getByTestId('press-colour-note')).toContainText('approximation');
	await page.getByLabel('Name', { exact: true }).fill('Dusk Wanderer');
	await page.getByRole('button', { name: 'Save the runner' }).click();
	const note = page.locator('[data-tone]').first();
	await expect(note).toBeVisible({ timeout: 15_000 });
	const tone = await note.getAttribute('data-tone');
	expect(['success', 'warning']).toContain(tone);
	if (tone === 'warning') await expect(note.getByRole('link').first()).toHaveAttribute('href', /money-tables\?table=/);
	await page.goto(`/games/${gameId}`);
	await hydrated(page);
	const list = page.getByTestId('readiness');
	await expect(list).toContainText('Dusk Wanderer has no movement cards');
	await expect(list.getByRole('link', { name: /Dusk Wanderer has no movement cards/ })).toHaveAttribute('href', /runners\?runner=/);
	await shot(page, 'readiness-overview');
	// Plain words when the form is wrong.
	await page.goto(`/games/${gameId}/runners?new`);
	await hydrated(page);
	await page.getByRole('button', { name: 'Save the runner' }).click();
	await expect(page.getByText('Fill this in.').first()).toBeVisible();
});

test('leaving a runner with unsaved changes asks first; staying keeps the change', async ({ page }) => {
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/runners`);
	await hydrated(page);
	await page.getByLabel('Name', { exact: true }).fill('Renamed but not saved');
	await page.getByRole('link', { name: 'Money tables' }).first().click();
	const prompt = page.getByTestId('unsaved-prompt');
	await expect(prompt).toBeVisible();
	await shot(page, 'unsaved-prompt');
	await prompt.getByRole('button', { name: 'Stay on this page' }).click();
	await expect(page).toHaveURL(/runners/);
	await expect(page.getByLabel('Name', { exact: true })).toHaveValue('Renamed but not saved');
	await page.getByRole('link', { name: 'Money tables' }).first().click();
	await prompt.getByRole('button', { name: 'Leave and lose the changes' }).click();
	await expect(page).toHaveURL(/money-tables/);
});
