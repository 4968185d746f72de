// `npm start`: builds the app when the build is missing or older than the sources, then serves it.
// Migrations and the demo seed run inside the app at start-up.
import { spawn } from 'node:child_process';
import { buildAppIfStale } from './build-if-stale.js';

const root = new URL('..', import.meta.url).pathname;
process.chdir(root);

try {
	await buildAppIfStale();
} catch (e) {
	console.error(e.message);
	process.exit(1);
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
