import { test, expect } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { hydrated, signIn, demoGameId } from './helpers';

test('a printer picks a profile, downloads the sheet PDF of the released demo proof, and it opens', async ({ page }) => {
	await signIn(page, 'printer@paddock.test');
	await page.getByRole('link', { name: 'Mossbank Games' }).first().click();
	await page.getByRole('link', { name: 'The Marrowbed Derby' }).click();
	await page.getByRole('navigation', { name: 'Game' }).getByRole('link', { name: 'Print', exact: true }).click();
	await hydrated(page);
	await expect(page.getByLabel('Print', { exact: true })).toHaveValue('1');
	await page.getByLabel('Printer profile').selectOption({ label: 'Office laser, A4 duplex' });
	await expect(page.getByTestId('sheet-preview')).toBeVisible({ timeout: 30_000 });
	await expect(page.getByTestId('plan')).toContainText('cards a sheet');
	// The page follows the build by its event stream, not by asking again and again.
	const asked: string[] = [];
	page.on('request', (r) => {
		if (r.url().includes('/api/v1/print-jobs/')) asked.push(new URL(r.url()).pathname);
	});
	const [started] = await Promise.all([
		page.waitForResponse((r) => r.request().method() === 'POST' && r.url().endsWith('/print-jobs')),
		page.getByRole('button', { name: 'Build the sheet PDF' }).click()
	]);
	const link = page.getByTestId('download-sheets');
	await expect(link).toBeVisible({ timeout: 60_000 });
	// A build of the very same file a moment ago answers done at once, with nothing to follow.
	const followed = ((await started.json()) as { state: string }).state === 'done' ? 0 : 1;
	expect(asked.filter((p) => p.endsWith('/events'))).toHaveLength(followed);
	expect(asked.filter((p) => /\/print-jobs\/[^/]+$/.test(p))).toHaveLength(0);
	const [download] = await Promise.all([page.waitForEvent('download'), link.click()]);
	const file = join(mkdtempSync(join(tmpdir(), 'paddock-print-')), 'sheets.pdf');
	await download.saveAs(file);
	// An independent reader opens it: poppler's pdfinfo (A4 is 595.28 × 841.89 pt, ISO 216 at 72 pt/in).
	const info = execFileSync('pdfinfo', [file], { encoding: 'utf8' });
	expect(info).toMatch(/Pages:\s+\d+/);
	expect(info).toMatch(/Page size:\s+(595\.2\d* x 841\.8\d*|841\.8\d* x 595\.2\d*) pts/);
	expect(info).toContain('proof 1');
	execFileSync('qpdf', ['--check', file]);
});

test('printers cannot print the working copy; a bad parameter answers 400 with its reason', async ({ page }) => {
	await signIn(page, 'printer@paddock.test');
	const gameId = await demoGameId(page);
	expect((await page.request.get(`/api/v1/games/${gameId}/print.pdf`)).status()).toBe(403);
	const bad = await page.request.get(`/api/v1/games/${gameId}/proofs/1/print.pdf?paper=a7`);
	expect(bad.status()).toBe(400);
	expect((await bad.json()).error.message).toContain('Unknown paper');
});
