import type { Page } from '@playwright/test';
import { demoGameId } from './helpers';

/** Every page of the app a role opens, by its address (the demo game, its first proof and kinds). */
export async function appPages(page: Page, role: 'owner' | 'designer' | 'artist' | 'printer' | 'reviewer'): Promise<string[]> {
	const me = await (await page.request.get('/api/v1/me')).json();
	const team = me.memberships[0].teamId as string;
	const G = `/games/${await demoGameId(page)}`;
	const teamPages = ['/', '/account', `/teams/${team}`, `/teams/${team}/members`, `/teams/${team}/printers`, '/teams/new', '/mail'];
	const proofPages = [`${G}/proofs`, `${G}/proofs/1`, `${G}/print`];
	const gamePages = [
		G,
		`${G}/runners`,
		`${G}/money-tables`,
		`${G}/kinds`,
		`${G}/kinds/kd-movement`,
		`${G}/kinds/kd-movement?view=settings`,
		`${G}/kinds/kd-movement?view=generate`,
		`${G}/kinds/kd-movement/csv`,
		`${G}/kinds/kd-movement/gallery`,
		`${G}/art`,
		`${G}/odds`,
		`${G}/proofs/compare?a=1&b=1`,
		`${G}/activity`,
		`${G}/history`,
		`${G}/settings`,
		...proofPages
	];
	if (role === 'printer') return ['/', `/teams/${team}/printers`, G, ...proofPages];
	if (role === 'designer') return [...teamPages, ...gamePages, `${G}/no-such-page`];
	return ['/', `/teams/${team}`, ...gamePages];
}

/** Waits for hydration and for the page's own fetches (previews, lists) to settle. */
export async function settled(page: Page) {
	await page.waitForFunction(() => document.documentElement.dataset.ready === 'yes');
	await page.waitForLoadState('networkidle').catch(() => {});
}
