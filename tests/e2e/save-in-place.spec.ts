import { test, expect, type Page, type Request } from '@playwright/test';
import { signIn, signInNewBrowser, hydrated, demoGameId } from './helpers';

/** Every reload of page data SvelteKit makes (its load functions answer at `__data.json`). */
function dataReloads(page: Page): Request[] {
	const seen: Request[] = [];
	page.on('request', (r) => {
		if (new URL(r.url()).pathname.endsWith('/__data.json')) seen.push(r);
	});
	return seen;
}

async function openMovementCard(page: Page, gameId: string, cardId?: string): Promise<string> {
	await page.goto(`/games/${gameId}/kinds`);
	await page.getByRole('link', { name: 'Movement cards' }).click();
	await expect(page).toHaveURL(new RegExp(`/games/${gameId}/kinds/[^/?]+$`));
	const kindPath = new URL(page.url()).pathname;
	if (cardId) await page.goto(`${kindPath}?card=${cardId}`);
	await hydrated(page);
	return kindPath;
}

const cardRow = (page: Page, name: string) =>
	page.getByRole('table', { name: 'Cards of this kind' }).getByRole('row').filter({ has: page.getByRole('link', { name, exact: true }) });

/** Saves the card and reads the action's answer (SvelteKit sends a refusal as `failure` with its status). */
async function save(page: Page, button = 'Save the card'): Promise<{ type: string; status: number }> {
	const answer = page.waitForResponse((r) => r.request().method() === 'POST' && r.url().includes('/saveCard'));
	await page.getByRole('button', { name: button }).click();
	return (await answer).json();
}

test('a card save shows the saved card without reloading the page; the next save is checked against it, and a stale one still meets the conflict', async ({
	page,
	browser,
	baseURL
}) => {
	test.setTimeout(120_000);
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	const kindPath = await openMovementCard(page, gameId);
	// The second card of the kind, opened by its address.
	const second = page.getByRole('table', { name: 'Cards of this kind' }).getByRole('row').nth(2).getByRole('link');
	const cardId = new URL((await second.getAttribute('href'))!, page.url()).searchParams.get('card')!;
	await openMovementCard(page, gameId, cardId);

	const name = page.getByRole('textbox', { name: /^Card name/ });
	const copies = page.getByRole('spinbutton', { name: 'Copies printed' });
	const before = Number(await copies.inputValue());
	const reloads = dataReloads(page);

	await name.fill('Steady trot');
	await copies.fill(String(before + 2));
	expect(await save(page)).toMatchObject({ type: 'success', status: 200 });
	// "Saved." (with links to parts of the game that need a look when other tests left some).
	const note = page.locator('form[action="?/saveCard"] [data-tone]');
	await expect(note).toContainText('Saved.');
	await expect(note).not.toHaveAttribute('data-tone', 'error');
	// The card list shows the saved card from the save's answer.
	await expect(cardRow(page, 'Steady trot')).toBeVisible();
	await expect(cardRow(page, 'Steady trot').getByRole('cell').filter({ hasText: String(before + 2) }).first()).toBeVisible();
	await expect(page.getByRole('heading', { name: 'Edit “Steady trot”' })).toBeVisible();
	await page.screenshot({ path: 'test-results/save-in-place-after-save.png', fullPage: true });

	// A second person opens the same card now (at the version just saved).
	const stale = await signInNewBrowser(browser, 'owner@paddock.test', { baseURL });
	await openMovementCard(stale, gameId, cardId);
	await expect(stale.getByRole('textbox', { name: /^Card name/ })).toHaveValue('Steady trot');

	// The first person saves again from the answered form: its version is the saved one, so no false conflict.
	await copies.fill(String(before + 1));
	expect(await save(page)).toMatchObject({ type: 'success', status: 200 });
	await expect(note).toContainText('Saved.');
	await expect(note).not.toHaveAttribute('data-tone', 'error');
	await expect(cardRow(page, 'Steady trot').getByRole('cell').filter({ hasText: String(before + 1) }).first()).toBeVisible();

	// No load ran again after either save.
	expect(reloads.map((r) => r.url())).toEqual([]);

	// The second person's save is now stale: refused, with the reason, and nothing of theirs written.
	await stale.getByRole('textbox', { name: /^Card name/ }).fill('Late change');
	expect(await save(stale)).toMatchObject({ type: 'failure', status: 409 });
	await expect(stale.getByRole('alert').filter({ hasText: 'Someone saved this card after you opened it' })).toBeVisible();
	await stale.screenshot({ path: 'test-results/save-in-place-stale.png', fullPage: true });
	await stale.context().close();

	// The saved form is not dirty: leaving asks nothing.
	await page.getByRole('link', { name: 'Runners', exact: true }).click();
	await expect(page).toHaveURL(`/games/${gameId}/runners`);
	await expect(page.getByTestId('unsaved-prompt')).not.toBeVisible();

	// What was saved is what the server holds.
	await page.goto(`${kindPath}?card=${cardId}`);
	await expect(page.getByRole('textbox', { name: /^Card name/ })).toHaveValue('Steady trot');
	await expect(page.getByRole('spinbutton', { name: 'Copies printed' })).toHaveValue(String(before + 1));
});

test('a new card saved in place becomes the card the editor edits', async ({ page }) => {
	test.setTimeout(120_000);
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	const kindPath = await openMovementCard(page, gameId);
	await page.goto(`${kindPath}?card=new`);
	await hydrated(page);
	const reloads = dataReloads(page);
	await page.getByRole('textbox', { name: /^Card name/ }).fill('Quick start');
	expect(await save(page, 'Add the card')).toMatchObject({ type: 'success', status: 200 });
	await expect(cardRow(page, 'Quick start')).toBeVisible();
	// The address names the new card, and the editor now edits it rather than adding another.
	await expect(page).toHaveURL(new RegExp(`card=[0-9a-f-]{36}`));
	await expect(page.getByRole('button', { name: 'Save the card' })).toBeVisible();
	await page.getByRole('spinbutton', { name: 'Copies printed' }).fill('3');
	expect(await save(page)).toMatchObject({ type: 'success', status: 200 });
	await expect(cardRow(page, 'Quick start')).toHaveCount(1);
	expect(reloads.map((r) => r.url())).toEqual([]);
});

test('an art placement saved in place shows where the piece prints now, and the next save is checked against it', async ({ page }) => {
	test.setTimeout(120_000);
	await signIn(page, 'artist@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/art`);
	await hydrated(page);
	const printsOn = page.locator('dt', { hasText: 'Prints on' }).locator('xpath=following-sibling::dd[1]');
	await expect(printsOn).not.toHaveText('Not assigned');
	const reloads = dataReloads(page);
	const saveArt = async () => {
		const answer = page.waitForResponse((r) => r.request().method() === 'POST' && r.url().includes('/save'));
		await page.getByRole('button', { name: 'Save status and slot' }).click();
		return (await answer).json();
	};

	await page.getByRole('combobox', { name: /^Slot/ }).selectOption({ label: 'Not yet (assign it later)' });
	expect(await saveArt()).toMatchObject({ type: 'success' });
	await expect(page.getByText(/^Saved\. It is not assigned to a slot\./)).toBeVisible();
	await expect(printsOn).toHaveText('Not assigned');

	// The page has other Status fields (upload, replace): take the one in the placement's own form.
	const placement = page.locator('form', { has: page.getByRole('button', { name: 'Save status and slot' }) });
	await placement.getByRole('combobox', { name: /^Status/ }).selectOption('sketch');
	expect(await saveArt()).toMatchObject({ type: 'success' });
	await expect(page.getByText(/^Saved\./)).toBeVisible();
	expect(reloads.map((r) => r.url())).toEqual([]);
	await page.screenshot({ path: 'test-results/save-in-place-art.png', fullPage: true });
});
