// Browser tests: Playwright driving Debian's chromium against a fresh demo instance.
import { existsSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';

const chromium = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
if (!existsSync(chromium)) {
	console.error(`The browser tests need Debian's chromium at ${chromium}. Install it with:\n\n  sudo apt-get update && sudo apt-get install -y chromium poppler-utils qpdf\n`);
	process.exit(1);
}
const env = { ...process.env, E2E_DATA_DIR: mkdtempSync(join(tmpdir(), 'paddock-e2e-')) };
const run = spawnSync('npx', ['playwright', 'test', ...process.argv.slice(2)], { stdio: 'inherit', env });
process.exit(run.status ?? 1);
