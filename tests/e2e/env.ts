import { tmpdir } from 'node:os';
import { join } from 'node:path';

export const E2E_PORT = Number(process.env.E2E_PORT ?? 4173);
/** A fresh data directory per run, made by scripts/e2e.js. */
export const E2E_DATA_DIR = process.env.E2E_DATA_DIR ?? join(tmpdir(), 'paddock-e2e');
export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
