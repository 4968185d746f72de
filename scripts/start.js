// `npm start`: builds the app when the build is missing or older than the sources, then serves it.
// Migrations and the demo seed run inside the app at start-up.
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync, spawn } from 'node:child_process';

const root = new URL('..', import.meta.url).pathname;
process.chdir(root);

function newest(path) {
	const s = statSync(path);
	if (!s.isDirectory()) return s.mtimeMs;
	let max = s.mtimeMs;
	for (const name of readdirSync(path)) max = Math.max(max, newest(join(path, name)));
	return max;
}

const marker = join(root, 'build', 'index.js');
const sources = ['src', 'static', 'templates', 'package.json', 'svelte.config.js', 'vite.config.ts'];
const stale = !existsSync(marker) || Math.max(...sources.map(newest)) > statSync(marker).mtimeMs;
if (stale) {
	console.log('Building Paddock…');
	const built = spawnSync('npx', ['vite', 'build', '--logLevel', 'error'], { stdio: 'inherit' });
	if (built.status !== 0) process.exit(built.status ?? 1);
}

const port = process.env.PORT ?? '3000';
const env = {
	...process.env,
	PORT: port,
	ORIGIN: process.env.ORIGIN ?? `http://localhost:${port}`,
	// Game bundles and artwork are larger than the default cap; routes apply their own limits.
	BODY_SIZE_LIMIT: process.env.BODY_SIZE_LIMIT ?? '210M'
};
const server = spawn(process.execPath, ['build/index.js'], { stdio: 'inherit', env });
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal));
server.on('exit', (code) => process.exit(code ?? 0));
