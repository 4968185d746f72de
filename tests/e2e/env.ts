import { tmpdir } from 'node:os';
import { join } from 'node:path';

export const E2E_PORT = Number(process.env.E2E_PORT ?? 4173);
/** A fresh data directory per run, made by scripts/e2e.js. */
export const E2E_DATA_DIR = process.env.E2E_DATA_DIR ?? join(tmpdir(), 'paddock-e2e');
export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/** Headless, and quiet on a machine without a network: no background calls, no updates, no sync. */
export const CHROMIUM_ARGS = [
	'--headless',
	'--no-sandbox',
	'--disable-gpu',
	'--disable-quic',
	'--no-first-run',
	'--disable-background-networking',
	'--disable-component-update',
	'--disable-sync'
];
