/**
 * An automated accessibility scan of every page with axe-core (its Playwright integration), for
 * the WCAG 2.0 and 2.1 level A and AA rules: a serious or critical finding fails the test.
 * Automated rules catch a part of WCAG only; they keep what was fixed from coming back.
 */
import { test, expect, type Page } from '@playwright/test';
import { AxeBuilder } from '@axe-core/playwright';
import { hydrated, signIn, signInNewBrowser, demoGameId } from './helpers';
import { appPages, settled } from './pages';

const TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];

async function scan(page: Page, path: string) {
	const results = await new AxeBuilder({ page }).withTags(TAGS).analyze();
	return results.violations
		.filter((v) => v.impact === 'serious' || v.impact === 'critical')
		.map((v) => `${path}: ${v.id} (${v.impact}) at ${v.nodes.map((n) => n.target.join(' ')).slice(0, 3).join(', ')}: ${v.help}`);
}

for (const role of ['designer', 'artist', 'printer', 'reviewer', 'owner'] as const) {
	test(`every page a ${role} opens passes the scan`, async ({ page }) => {
		test.setTimeout(600_000);
		await signIn(page, `${role}@paddock.test`);
		const pages = role === 'owner' ? (await appPages(page, 'designer')).filter((p) => p.includes('/teams/')) : await appPages(page, role);
		const findings: string[] = [];
		for (const path of pages) {
			await page.goto(path);
			await settled(page);
			findings.push(...(await scan(page, path)));
		}
		expect(findings).toEqual([]);
	});
}

test('the signed-out pages and the not-found page pass the scan', async ({ page }) => {
	const findings: string[] = [];
	for (const path of ['/signin', '/signup', '/forgot', '/no-such-page']) {
		await page.goto(path);
		await settled(page);
		findings.push(...(await scan(page, path)));
	}
	expect(findings).toEqual([]);
});

test('the card editor: a skip link passes the card rows, and the preview has words for screen readers', async ({ page }) => {
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/kinds/kd-movement`);
	await hydrated(page);
	const skip = page.getByTestId('skip-to-editor');
	await skip.focus();
	await expect(skip).toBeVisible();
	await page.keyboard.press('Enter');
	await expect(page).toHaveURL(/#card-editor$/);
	// The next Tab lands in the editor, not on a card row.
	await page.keyboard.press('Tab');
	const inEditor = await page.evaluate(() => !!document.activeElement?.closest('#card-editor'));
	expect(inEditor).toBe(true);
	// The preview's text alternative names the card and its values.
	const front = page.getByTestId('card-preview').getByRole('img').first();
	await expect(front).toHaveAttribute('aria-label', /^Front of “.+”: .*\d/);
	// The gallery's faces too.
	await page.goto(`/games/${gameId}/kinds/kd-movement/gallery`);
	await hydrated(page);
	const alt = await page.locator('img[alt^="Front of"]').first().getAttribute('alt');
	expect(alt).toMatch(/^Front of .+: .*\d/);
});

test('the proof grid, a filtered grid and a card open large pass the scan for every role that sees them', async ({ browser }) => {
	test.setTimeout(300_000);
	const findings: string[] = [];
	for (const role of ['owner', 'designer', 'artist', 'reviewer', 'printer'] as const) {
		// A browser of its own per role: a face still loading for the role before would otherwise
		// bring its session cookie back after the cookies were cleared.
		const page = await signInNewBrowser(browser, `${role}@paddock.test`);
		const gameId = await demoGameId(page);
		// Printers may not read the working game's cards: they get the release page, with no grid.
		const cardId = role === 'printer' ? 'any' : (await (await page.request.get(`/api/v1/games/${gameId}/cards`)).json()).cards[0].id;
		const base = `/games/${gameId}/proofs/1`;
		for (const path of [base, `${base}?state=quiet`, `${base}?card=${encodeURIComponent(cardId)}`]) {
			await page.goto(path);
			await settled(page);
			if (role !== 'printer' && path.includes('card=')) await expect(page.getByTestId('card-large')).toBeVisible();
			findings.push(...(await scan(page, `${role} ${path}`)));
		}
		await page.context().close();
	}
	expect(findings).toEqual([]);
});
