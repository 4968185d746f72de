// The integration suite's second pass: the same tests on a PostgreSQL server and an S3-compatible
// bucket instead of in-memory PGlite and a data directory. Starts both, throw-away, runs vitest
// on tests/integration (and the multi-process tests in tests/cluster), then stops both.
//   node scripts/test-server.js [vitest arguments…]
import { spawn } from 'node:child_process';
import { startPostgres, startBucket } from './services.js';

const args = process.argv.slice(2);
const targets = args.length ? args : ['tests/integration', 'tests/cluster'];

const pg = await startPostgres({ port: Number(process.env.PADDOCK_PG_PORT) || undefined });
let bucket;
let status = 1;
try {
	bucket = await startBucket({ port: Number(process.env.PADDOCK_S3_PORT) || undefined });
	console.log(`Integration tests on PostgreSQL (port ${pg.port}) and a local bucket (${bucket.endpoint})`);
	// Not spawnSync: the bucket is served from this process's event loop.
	const run = spawn('npx', ['vitest', 'run', ...targets], {
		stdio: 'inherit',
		env: { ...process.env, PADDOCK_TEST_DATABASE_URL: pg.url, PADDOCK_TEST_STORAGE_URL: bucket.url }
	});
	// Interrupted: stop vitest, then fall through to stopping the services.
	for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => run.kill(signal));
	status = await new Promise((ok) => run.on('exit', (code) => ok(code ?? 1)));
} finally {
	await bucket?.stop();
	await pg.stop();
}
process.exit(status);
