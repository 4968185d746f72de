import { test, expect } from '@playwright/test';
import { spawnSync } from 'node:child_process';
import { E2E_DATA_DIR, E2E_PORT } from './env';

test('a second server on the same data directory refuses to start and says why', async () => {
	const port = String(E2E_PORT + 26);
	const second = spawnSync(process.execPath, ['build/index.js'], {
		env: { ...process.env, PORT: port, PADDOCK_DATA_DIR: E2E_DATA_DIR, ORIGIN: `http://localhost:${port}` },
		encoding: 'utf8',
		timeout: 30_000
	});
	expect(second.status).toBe(1);
	expect(second.stderr).toContain('is in use by another Paddock process');
});
