// `npm start`: builds the app when the build is missing or older than the sources, then serves it.
// Migrations and the demo seed run inside the app at start-up.
import { spawn } from 'node:child_process';
import { createInterface } from 'node:readline';
import { buildAppIfStale } from './build-if-stale.js';
import { appEnv } from './app-env.js';

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
	...appEnv(),
	PORT: port,
	ORIGIN: process.env.ORIGIN ?? `http://localhost:${port}`,
	// Game bundles and artwork are larger than the default cap; routes apply their own limits.
	BODY_SIZE_LIMIT: process.env.BODY_SIZE_LIMIT ?? '210M'
};
// The server's own "Listening on 0.0.0.0:…" is not an address to open: the app prints the one to open.
const server = spawn(process.execPath, ['build/index.js'], { stdio: ['inherit', 'pipe', 'inherit'], env });
createInterface({ input: server.stdout }).on('line', (line) => {
	if (!/^Listening on /.test(line)) console.log(line);
});
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal));
server.on('exit', (code) => process.exit(code ?? 0));
