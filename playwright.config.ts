import { defineConfig } from '@playwright/test';
import { E2E_DATA_DIR, E2E_PORT, CHROMIUM, CHROMIUM_ARGS } from './tests/e2e/env';

export default defineConfig({
	testDir: 'tests/e2e',
	timeout: 60_000,
	fullyParallel: false,
	workers: 1,
	reporter: [['list']],
	use: {
		baseURL: `http://localhost:${E2E_PORT}`,
		launchOptions: {
			executablePath: CHROMIUM,
			args: CHROMIUM_ARGS
		}
	},
	webServer: {
		command: 'node scripts/start.js',
		url: `http://localhost:${E2E_PORT}/signin`,
		// Includes a build when the sources are newer than build/: minutes on a busy machine.
		timeout: 900_000,
		reuseExistingServer: false,
		stdout: 'pipe',
		env: { PORT: String(E2E_PORT), PADDOCK_DATA_DIR: E2E_DATA_DIR, PADDOCK_DEMO: '1' }
	}
});
