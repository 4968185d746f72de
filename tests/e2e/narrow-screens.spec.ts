/**
 * Every page on a 390 px wide phone screen: the page never scrolls sideways (wide tables scroll in
 * their own box), and the menus stay in reach. Screenshots of Overview and Print at that width go
 * to E2E_SHOTS when it is set.
 */
import { test, expect, type Page } from '@playwright/test';
import { signIn, demoGameId } from './helpers';
import { appPages, settled } from './pages';

test.use({ viewport: { width: 390, height: 844 } });

const SHOTS = process.env.E2E_SHOTS;

/** How far the page reaches past the screen's right edge, and the elements that stick out. */
async function overflow(page: Page) {
	return page.evaluate(() => {
		const width = document.documentElement.clientWidth;
		const out = [...document.querySelectorAll('body *')]
			.filter((e) => e.getBoundingClientRect().right > width + 1)
			.filter((e) => {
				for (let a = e.parentElement; a; a = a.parentElement) {
					const o = getComputedStyle(a).overflowX;
					if (o === 'auto' || o === 'scroll' || o === 'hidden' || o === 'clip') return false;
				}
				return true;
			})
			.slice(0, 3)
			.map((e) => `${e.tagName.toLowerCase()}${e.id ? '#' + e.id : ''}.${String(e.getAttribute('class') ?? '').slice(0, 50)}`);
		return { extra: document.documentElement.scrollWidth - width, out };
	});
}

for (const role of ['designer', 'printer', 'reviewer'] as const) {
	test(`every page a ${role} opens fits 390 px without sideways scrolling`, async ({ page }) => {
		test.setTimeout(600_000);
		await signIn(page, `${role}@paddock.test`);
		const problems: string[] = [];
		for (const path of await appPages(page, role)) {
			await page.goto(path);
			await settled(page);
			const o = await overflow(page);
			if (o.extra > 0) problems.push(`${path}: ${o.extra} px too wide (${o.out.join(', ')})`);
		}
		expect(problems).toEqual([]);
	});
}

test('the menus are in reach at 390 px; Overview and Print screenshots', async ({ page }) => {
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	for (const [path, name] of [
		[`/games/${gameId}`, 'overview-390'],
		[`/games/${gameId}/print`, 'print-390']
	] as const) {
		await page.goto(path);
		await settled(page);
		for (const nav of [page.getByRole('navigation', { name: 'Main' }), page.getByRole('navigation', { name: 'Game' })]) {
			for (const link of await nav.getByRole('link').all()) {
				await expect(link).toBeVisible();
				const box = (await link.boundingBox())!;
				expect(box.x).toBeGreaterThanOrEqual(0);
				expect(box.x + box.width).toBeLessThanOrEqual(390);
			}
		}
		if (SHOTS) await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });
	}
});
