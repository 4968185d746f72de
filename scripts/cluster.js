// `npm run start:cluster`: N app processes on one machine against one PostgreSQL server and one
// S3-compatible bucket, to try Paddock as it runs on several machines.
//   PADDOCK_PROCESSES=3 npm run start:cluster     (default 2; ports PORT, PORT+1, …; PORT default 3000)
// DATABASE_URL and PADDOCK_STORAGE_URL are used when set. When not, a throw-away PostgreSQL
// cluster and a local bucket (s3rver) are started and removed on exit: nothing is kept.
// Ctrl-C stops every process gracefully: running requests and builds finish first.
import { spawn } from 'node:child_process';
import { appEnv } from './app-env.js';
import { randomBytes } from 'node:crypto';
import { buildAppIfStale } from './build-if-stale.js';
import { startPostgres, startBucket } from './services.js';

const root = new URL('..', import.meta.url).pathname;
process.chdir(root);

const count = Math.max(1, Number(process.env.PADDOCK_PROCESSES ?? process.argv[2] ?? 2));
const basePort = Number(process.env.PORT ?? 3000);

try {
	await buildAppIfStale();
} catch (e) {
	console.error(e.message);
	process.exit(1);
}

const stops = [];
let databaseUrl = process.env.DATABASE_URL;
if (!databaseUrl) {
	const pg = await startPostgres({ port: Number(process.env.PADDOCK_PG_PORT) || undefined });
	stops.push(pg.stop);
	databaseUrl = pg.url;
	console.log(`A throw-away PostgreSQL server on port ${pg.port} (removed on exit)`);
}
let storageUrl = process.env.PADDOCK_STORAGE_URL;
if (!storageUrl) {
	const bucket = await startBucket({ port: Number(process.env.PADDOCK_S3_PORT) || undefined });
	stops.push(bucket.stop);
	storageUrl = bucket.url;
	console.log(`A local bucket at ${bucket.endpoint} (removed on exit)`);
}

const env = {
	...appEnv(),
	DATABASE_URL: databaseUrl,
	PADDOCK_STORAGE_URL: storageUrl,
	// Every process must sign and read the same session cookies.
	AUTH_SECRET: process.env.AUTH_SECRET ?? randomBytes(32).toString('base64url'),
	BODY_SIZE_LIMIT: process.env.BODY_SIZE_LIMIT ?? '210M'
};

const children = [];
let stopping = false;
function start(i) {
	const port = basePort + i;
	const child = spawn(process.execPath, ['build/index.js'], {
		stdio: 'inherit',
		env: { ...env, PORT: String(port), ORIGIN: process.env.ORIGIN ?? `http://localhost:${port}` }
	});
	child.on('exit', (code, signal) => {
		children.splice(children.indexOf(child), 1);
		if (!stopping) {
			console.error(`Process on port ${port} ended (${signal ?? code}); stopping the others.`);
			void stop(code || 1);
		} else if (children.length === 0) void finish();
	});
	children.push(child);
}

let exitCode = 0;
async function finish() {
	for (const s of stops) await s().catch((e) => console.error(e.message));
	process.exit(exitCode);
}

function stop(code = 0) {
	if (stopping) return;
	stopping = true;
	exitCode = code;
	if (children.length === 0) return finish();
	for (const c of children) c.kill('SIGTERM');
}

for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => stop(0));

// They start together: migrations and the demo seed run once, under a lock in the database.
for (let i = 0; i < count; i++) start(i);
console.log(`Paddock: ${count} processes on ${Array.from({ length: count }, (_, i) => `http://localhost:${basePort + i}`).join(', ')}`);
