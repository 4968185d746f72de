import { test, expect, type Page } from '@playwright/test';
import { Jimp } from 'jimp';
import { hydrated, signIn, demoGameId } from './helpers';

const artCount = async (page: Page, gameId: string) => (await (await page.request.get(`/api/v1/games/${gameId}/art`)).json()).art.length as number;

test('an artist uploads a low-resolution PNG for a poker-size back and is warned it prints under 300 dpi', async ({ page }) => {
	await signIn(page, 'artist@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/art`);
	await hydrated(page);

	const png = await new Jimp({ width: 200, height: 200, color: 0xe0a526ff }).getBuffer('image/png');
	await page.getByLabel('Art file').setInputFiles({ name: 'setup-back-draft.png', mimeType: 'image/png', buffer: png });
	// The setup cards' shared back: a poker card (63.5 × 88.9 mm) with 3 mm bleed per side.
	await page.getByLabel('Prints on').selectOption('kind kd-setup backArt');
	await page.getByRole('button', { name: 'Upload the art' }).click();

	await expect(page).toHaveURL(/uploaded=1/);
	const panel = page.getByRole('complementary');
	await expect(panel.getByRole('status')).toContainText('Uploaded “setup-back-draft.png”');
	await expect(panel.getByRole('heading', { name: 'setup-back-draft.png' })).toBeVisible();
	// Cover-fitted into 69.5 × 94.9 mm, the 200 px span 94.9 mm = 3.736 in: 53.5 dpi
	// (25.4 mm per inch; 300 dpi is common practice for print).
	await expect(panel.getByTestId('dpi-warning')).toContainText(
		'prints at 53 dpi — 300 dpi or more is common practice for print; ask for a larger file'
	);
	const piece = page.getByTestId('art-piece').filter({ hasText: 'setup-back-draft.png' });
	await expect(piece.getByTestId('dpi-warning')).toBeVisible();
	await expect(piece).toContainText('200 × 200 px');
	await expect(piece).toContainText('sketch');
	await expect(panel.getByRole('heading', { name: 'Versions (1)' })).toBeVisible();
	await page.screenshot({ path: test.info().outputPath('artist-after-upload.png') });
});

test('a hostile upload shows why it was refused, and nothing is added', async ({ page }) => {
	await signIn(page, 'artist@paddock.test');
	const gameId = await demoGameId(page);
	const before = await artCount(page, gameId);
	await page.goto(`/games/${gameId}/art`);
	await hydrated(page);

	const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="40" height="40"><script>alert(1)</script><rect width="40" height="40"/></svg>';
	await page.getByLabel('Art file').setInputFiles({ name: 'badge.svg', mimeType: 'image/svg+xml', buffer: Buffer.from(svg) });
	await page.getByRole('button', { name: 'Upload the art' }).click();
	await expect(page.getByRole('alert')).toContainText('Nothing was stored. This SVG contains a <script> element.');

	// A GIF wearing a .png name: the type comes from the bytes (GIF89a signature).
	const gif = Buffer.from([...Buffer.from('GIF89a', 'latin1'), 10, 0, 10, 0, 0, 0, 0, 0x3b]);
	await page.getByLabel('Art file').setInputFiles({ name: 'portrait.png', mimeType: 'image/png', buffer: gif });
	await page.getByRole('button', { name: 'Upload the art' }).click();
	await expect(page.getByRole('alert')).toContainText('“portrait.png” is a GIF image');
	await page.screenshot({ path: test.info().outputPath('artist-refused.png') });
	expect(await artCount(page, gameId)).toBe(before);
});

test('an artist replaces a file and the earlier one stays in the history', async ({ page }) => {
	await signIn(page, 'artist@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/art?art=art-portrait-rn-pebble`);
	await hydrated(page);
	const panel = page.getByRole('complementary');
	await expect(panel.getByTestId('dpi-warning')).toBeVisible();

	const png = await new Jimp({ width: 700, height: 700, color: 0x4a78b8ff }).getBuffer('image/png');
	await panel.getByLabel('New file').setInputFiles({ name: 'snail-pebble-v2.png', mimeType: 'image/png', buffer: png });
	await panel.getByLabel('Status after replacing').selectOption('final');
	await panel.getByRole('button', { name: 'Replace the file' }).click();
	await expect(panel.getByRole('status')).toContainText('Replaced. “snail-pebble-v2.png” is version 2');
	await expect(panel.getByRole('heading', { name: 'Versions (2)' })).toBeVisible();
	await expect(panel.getByText('snail-pebble.png · 150 × 150 px')).toBeVisible();
	await expect(panel.getByTestId('dpi-warning')).toHaveCount(0);
	await page.screenshot({ path: test.info().outputPath('artist-after-replace.png'), fullPage: true });
});

test('a reviewer reads the art and its warnings but cannot change it; a printer is turned away', async ({ page, browser }) => {
	await signIn(page, 'reviewer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/art?art=art-back-dew`);
	await hydrated(page);
	await expect(page.getByText('You can read the art; artists, designers and owners upload and change it.')).toBeVisible();
	await expect(page.getByRole('heading', { name: 'Upload art' })).toHaveCount(0);
	await expect(page.getByRole('button', { name: 'Replace the file' })).toHaveCount(0);
	const panel = page.getByRole('complementary');
	await expect(panel.getByTestId('dpi-warning')).toContainText('300 dpi or more is common practice for print');
	await expect(panel.getByLabel('Status')).toBeDisabled();
	await page.screenshot({ path: test.info().outputPath('reviewer.png'), fullPage: true });

	const printer = await browser.newPage();
	await signIn(printer, 'printer@paddock.test');
	const res = await printer.goto(`/games/${gameId}/art`);
	expect(res?.status()).toBe(403);
	await printer.close();
});
