import { test, expect, type Page } from '@playwright/test';
import { signIn, hydrated } from './helpers';

/** The demo game's id, read the way a script would: through the API. */
async function demoGameId(page: Page): Promise<string> {
	const me = await (await page.request.get('/api/v1/me')).json();
	const list = await (await page.request.get(`/api/v1/teams/${me.memberships[0].teamId}/games`)).json();
	return list.games.find((g: { name: string }) => g.name === 'The Marrowbed Derby').id;
}

const BAD_CSV = ['name,copies,runner,steps', 'Rosehip dash,2,Rosehip,2', 'Saffron dash,1,Saffron,12'].join('\n');
const GOOD_CSV = BAD_CSV.replace('Saffron,12', 'Saffron,4');

test('a designer makes a card kind, imports a CSV with a bad row (nothing imported), fixes it, imports it and sees the faces', async ({ page }) => {
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/kinds`);
	await hydrated(page);
	await page.getByLabel('Name', { exact: true }).fill('Sprint cards');
	await page.getByRole('button', { name: 'Make the card kind' }).click();
	await expect(page).toHaveURL(new RegExp(`/games/${gameId}/kinds/[0-9a-f-]{36}$`));
	await expect(page.getByRole('heading', { name: 'Sprint cards' })).toBeVisible();
	const kindUrl = new URL(page.url()).pathname;

	await page.getByRole('link', { name: 'CSV', exact: true }).click();
	await expect(page).toHaveURL(`${kindUrl}/csv`);
	await hydrated(page);
	await page.getByLabel('CSV text').fill(BAD_CSV);
	await page.getByRole('button', { name: 'Preview the import' }).click();
	await expect(page.getByText('nothing will be imported until they are fixed')).toBeVisible();
	const problems = page.getByRole('table', { name: 'Problems in the file' });
	await expect(problems.getByRole('row', { name: /Line 3.*steps/ })).toBeVisible();
	await expect(page.getByRole('button', { name: /^Import/ })).toHaveCount(0);
	// Nothing was written: the kind still has no cards.
	await page.reload();
	await expect(page.getByText('0 designs · 0 printed cards')).toBeVisible();

	await hydrated(page);
	await page.getByLabel('CSV text').fill(GOOD_CSV);
	await page.getByRole('button', { name: 'Preview the import' }).click();
	await expect(page.getByTestId('csv-summary')).toContainText('2 new');
	await page.getByRole('button', { name: 'Import 2 changes' }).click();
	await expect(page.getByText('Imported: 2 new, 0 changed.')).toBeVisible();
	await expect(page.getByText('2 designs · 3 printed cards')).toBeVisible();

	await page.getByRole('link', { name: 'Gallery', exact: true }).click();
	await expect(page).toHaveURL(`${kindUrl}/gallery`);
	for (const name of ['Rosehip dash', 'Saffron dash']) {
		const face = page.getByRole('img', { name: `Front of ${name}` });
		await expect(face).toBeVisible();
		// The face really loaded (a broken image has no natural width).
		await expect.poll(() => face.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)).toBe(true);
	}
	await expect(page.getByRole('img', { name: 'Back of every Sprint cards card' })).toBeVisible();
});

test('a reviewer opens a card kind and cannot change it', async ({ page }) => {
	await signIn(page, 'reviewer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/kinds`);
	await expect(page.getByRole('heading', { name: 'New card kind' })).toHaveCount(0);
	await page.getByRole('link', { name: 'Movement cards' }).click();
	await hydrated(page);
	await expect(page.getByRole('table', { name: 'Cards of this kind' })).toBeVisible();
	await expect(page.getByRole('textbox', { name: /^Card name/ })).toBeDisabled();
	await expect(page.getByRole('button', { name: /Save|Add the card|Delete/ })).toHaveCount(0);
	// The preview still draws for a reader.
	await expect(page.getByTestId('card-preview').locator('svg').first()).toBeVisible();

	await page.getByRole('link', { name: 'Settings and layout' }).click();
	await expect(page.getByLabel('Name', { exact: true })).toBeDisabled();
	await expect(page.getByRole('button', { name: /Save|Delete/ })).toHaveCount(0);
	await expect(page.getByRole('link', { name: 'Generate', exact: true })).toHaveCount(0);

	await page.getByRole('link', { name: 'CSV', exact: true }).click();
	await expect(page.getByRole('link', { name: /Download the CSV/ })).toBeVisible();
	await expect(page.getByRole('button', { name: 'Preview the import' })).toHaveCount(0);
});

test('a designer’s card and kind previews draw from the editors’ state, and “As printed” shows the soft proof', async ({ page }) => {
	test.setTimeout(120_000);
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/kinds`);
	await page.getByRole('link', { name: 'Movement cards' }).click();
	await expect(page).toHaveURL(new RegExp(`/games/${gameId}/kinds/[^/?]+$`));
	await hydrated(page);
	const cardsUrl = page.url();
	const preview = page.getByTestId('card-preview');
	await expect(preview.locator('svg').first()).toBeVisible();
	await expect(page.getByText('is not complete yet')).toHaveCount(0);

	// The kind's own form (its back is a union of shapes) previews too.
	await page.getByRole('link', { name: 'Settings and layout' }).click();
	await hydrated(page);
	await expect(page.getByTestId('card-preview').locator('svg').first()).toBeVisible();
	await expect(page.getByText('is not complete yet')).toHaveCount(0);

	await page.goto(cardsUrl);
	await hydrated(page);
	// An edit redraws: the new name reaches the face.
	await page.getByRole('textbox', { name: /^Card name/ }).fill('Preview check');
	await expect(page.getByRole('heading', { name: 'Preview of “Preview check”' })).toBeVisible();
	await expect(preview.locator('svg').first()).toBeVisible();
	await expect(page.getByText('Drawn as you type')).toBeVisible();
	await expect(page.getByText('is not complete yet')).toHaveCount(0);
	await page.getByTestId('as-printed').check();
	const soft = preview.getByTestId('soft-proof').first();
	await expect(soft).toBeVisible({ timeout: 60_000 });
	await expect.poll(() => soft.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)).toBe(true);
	await page.screenshot({ path: 'test-results/card-preview-as-printed.png', fullPage: true });
});
