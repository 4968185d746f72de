import { test, expect } from '@playwright/test';
import { spawn } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { hydrated, signIn, demoGameId } from './helpers';
import { E2E_PORT } from './env';

test('a page that does not exist says where the person is and offers the ways back', async ({ page }) => {
	const res = await page.goto('/games/no/such/place');
	expect(res?.status()).toBe(404);
	const error = page.getByTestId('error-page');
	await expect(error.getByRole('heading', { level: 1 })).toHaveText('There is no page here');
	await expect(error).toContainText('/games/no/such/place');
	await expect(error.getByTestId('ways-back').getByRole('link', { name: 'Sign in' })).toBeVisible();

	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/kinds/no-such-kind`);
	await hydrated(page);
	// Inside the app's own frame: its menu stays, and the game's overview is a way back.
	await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
	const ways = page.getByTestId('ways-back');
	await expect(ways.getByRole('link', { name: /The overview of The Marrowbed Derby/ })).toHaveAttribute('href', `/games/${gameId}`);
	await expect(ways.getByRole('link', { name: 'Your teams and games' })).toBeVisible();
	await page.goto(`/games/${gameId}/no-such-page`);
	await expect(page.getByTestId('ways-back').getByRole('link', { name: 'The overview of this game' })).toHaveAttribute('href', `/games/${gameId}`);
});

test('the start-up log is short: the address to open and, in demo mode, the demo accounts', async () => {
	test.setTimeout(180_000);
	const port = E2E_PORT + 27;
	const server = spawn(process.execPath, ['scripts/start.js'], {
		env: { ...process.env, PORT: String(port), PADDOCK_DATA_DIR: mkdtempSync(join(tmpdir(), 'paddock-start-')), PADDOCK_DEMO: '1' },
		stdio: ['ignore', 'pipe', 'pipe']
	});
	let log = '';
	server.stdout.on('data', (b) => (log += b));
	server.stderr.on('data', (b) => (log += b));
	try {
		await expect.poll(() => log, { timeout: 150_000 }).toMatch(/demo-accounts|Demo mode:/);
	} finally {
		server.kill('SIGTERM');
	}
	const lines = log.trim().split('\n');
	expect(lines.length).toBeLessThanOrEqual(4);
	expect(log).toContain(`Paddock is ready: open http://localhost:${port}`);
	expect(log).toMatch(/Demo mode: sign in as owner@, designer@, artist@, printer@ or reviewer@paddock\.test with the password paddock-demo/);
	expect(log).not.toMatch(/Circular dependency|Listening on/);
});
