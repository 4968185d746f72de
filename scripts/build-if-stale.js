// Builds the app (`npm run build`) when build/ is missing or older than its sources.
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { buildPrint } from './build-print.js';
import { buildLog } from './build-log.js';
import { rewriteServerEntry } from './server-entry.js';

const root = new URL('..', import.meta.url).pathname;

/** The newest modification time under a path (files and folders). */
export function newest(path) {
	const s = statSync(path);
	if (!s.isDirectory()) return s.mtimeMs;
	let max = s.mtimeMs;
	for (const name of readdirSync(path)) max = Math.max(max, newest(join(path, name)));
	return max;
}

/** Whether `output` is missing or older than any of `sources` (paths from the project root). */
export function isStale(output, sources) {
	const out = join(root, output);
	return !existsSync(out) || Math.max(...sources.map((s) => newest(join(root, s)))) > statSync(out).mtimeMs;
}

const APP_SOURCES = ['src', 'static', 'templates', 'package.json', 'svelte.config.js', 'vite.config.ts', 'scripts/server-entry.js', 'scripts/helper-threads.js'];

/** Builds the app (`npm run build`): the SvelteKit server and client, then the print worker and CLI. */
export async function buildApp({ log = console.log } = {}) {
	const started = Date.now();
	const built = spawnSync('npx', ['vite', 'build', '--logLevel', 'error'], { cwd: root, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
	const { shown, hidden } = buildLog(`${built.stdout ?? ''}\n${built.stderr ?? ''}`, built.status === 0);
	if (shown) log(shown);
	if (built.status !== 0) throw new Error(`the build failed (exit ${built.status})`);
	rewriteServerEntry(join(root, 'build/index.js'));
	// The print worker and CLI as plain JavaScript (no TypeScript loader in the server's threads).
	await buildPrint({ quiet: true });
	log(`Built in ${Math.round((Date.now() - started) / 1000)} s${hidden ? ` (${hidden} bundler notices about third-party packages not shown)` : ''}.`);
}

export async function buildAppIfStale({ log = console.log } = {}) {
	if (!isStale('build/index.js', APP_SOURCES)) return false;
	log('Building Paddock…');
	await buildApp({ log });
	return true;
}
