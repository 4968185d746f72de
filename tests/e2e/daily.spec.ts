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
