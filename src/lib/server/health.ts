/**
 * Health for load balancers and orchestrators. `/healthz`: the process is up and serving.
 * `/readyz`: it can do its work now: the database and the file store both answer, and it is
 * not shutting down (a stopping process answers 503 so traffic drains to the others while its
 * running requests finish).
 */
import { startRuntime } from './runtime';
import { storage } from './storage';

/** A check that does not answer within this is reported as failing. */
const CHECK_MS = 3000;

let stopping = false;
for (const signal of ['SIGTERM', 'SIGINT'] as const) process.once(signal, () => (stopping = true));
process.once('sveltekit:shutdown', () => (stopping = true));

async function check(run: () => Promise<void>): Promise<string> {
	let timer: NodeJS.Timeout | undefined;
	try {
		await Promise.race([
			run(),
			new Promise((_, fail) => (timer = setTimeout(() => fail(new Error(`no answer within ${CHECK_MS} ms`)), CHECK_MS)))
		]);
		return 'ok';
	} catch (e) {
		return (e as Error).message || 'failed';
	} finally {
		clearTimeout(timer);
	}
}

export interface Readiness {
	ready: boolean;
	database: string;
	storage: string;
	stopping: boolean;
}

export async function readiness(): Promise<Readiness> {
	const [database, files] = await Promise.all([
		check(async () => (await startRuntime()).database.ping()),
		check(() => storage().ping())
	]);
	return { ready: !stopping && database === 'ok' && files === 'ok', database, storage: files, stopping };
}
