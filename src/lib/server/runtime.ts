/**
 * The app's long-lived parts: the database, the mail path, the demo seed and the print workers. Started once per
 * process (kept on globalThis so dev reloads reuse them) and closed on shutdown.
 */
import { openConfiguredDatabase, type Database, type Db } from './db';
import { caughtMail } from './db/schema';
import { startCatcher } from './mail/catcher';
import { configureMail } from './mail';
import { config } from './config';
import { printPool, closePrintPool } from '$lib/print/pool';
import { watchVitals } from './vitals';
import { collectWhenQuiet, growHeapsBeforeCollecting } from '$lib/threads/quiet-gc';
import { warmRecentGames } from './print-warmup';
import { defineJob, jobQueue, sharedQueue, useJobQueue } from './job-queue';
import { buildQueuedJob, failJob } from './print-jobs';
import { failOddsJob, runQueuedOddsJob, stopOddsRunsHere } from './odds';
import { closeJobsLeftOpen, startSweeping } from './job-sweep';
import { asBackground } from './db/turns';

interface Runtime {
	database: Database;
	stopCatcher?: () => Promise<void>;
	catching: boolean;
}

/** Each print worker's cache: enough for a large game's faces and art, small enough that the server stays lean. */
const WORKER_CACHE_BYTES = 48 * 1024 * 1024;

const slot = globalThis as typeof globalThis & { __paddock?: Promise<Runtime> };

/** Wires mail for a database: a real server when SMTP_URL is set, the local catcher otherwise. */
export async function startMail(db: Db, smtpUrl: string | null) {
	if (smtpUrl) {
		configureMail({ smtpUrl, from: config.mailFrom });
		return { catching: false };
	}
	const catcher = await startCatcher(async (m) => {
		await db.insert(caughtMail).values(m);
	});
	configureMail({ smtpUrl: `smtp://127.0.0.1:${catcher.port}`, from: config.mailFrom });
	return { catching: true, stop: catcher.stop };
}

/** The kinds of queued work, each reading its job's row from this database. */
function defineJobs(db: Db) {
	// Background work: a person's clicks go first at the database (./db/turns.ts).
	defineJob('print', {
		run: (id) => asBackground(() => buildQueuedJob(db, id)),
		giveUp: (id) => asBackground(() => failJob(db, id)),
		atOnce: () => printPool().size
	});
	defineJob('odds', { run: (id) => asBackground(() => runQueuedOddsJob(db, id)), giveUp: (id, e) => asBackground(() => failOddsJob(db, id, e)) });
}

/** Refusal to start with a message for the operator (printed without a stack, exit 1). */
export class StartupError extends Error {}

async function start(): Promise<Runtime> {
	if (config.databaseUrl && !process.env.AUTH_SECRET) {
		throw new StartupError(
			'AUTH_SECRET must be set when DATABASE_URL is: every Paddock process signs and reads the same session cookies. ' +
				'Make one with `openssl rand -base64 32` and give the same value to every process.'
		);
	}
	// Fewer full collections while builds run (see $lib/threads/quiet-gc.ts).
	growHeapsBeforeCollecting();
	const database = await openConfiguredDatabase(config.databaseUrl, config.dataDir);
	const mail = await startMail(database.db, config.smtpUrl);
	let demoNote: string | null = null;
	if (config.demo) {
		const { seedDemo, demoSignInNote } = await import('./demo');
		await database.exclusive(() => seedDemo(database.db));
		demoNote = await demoSignInNote(database.db);
	}
	// Print workers start now, load fonts and wasm and build the latest games once, so the
	// first build is not the slow one.
	let printWarm = false;
	const pool = printPool({ cacheBytes: WORKER_CACHE_BYTES });
	void pool
		.ready()
		.then(() => asBackground(() => warmRecentGames(database.db, pool)))
		.catch((e) => console.error('warming the print workers failed:', e))
		.finally(() => (printWarm = true));
	// The print caches' bounds ride along, so a soak can tell growth within them from a leak.
	watchVitals(() => ({ printWorkersWarm: printWarm, printWorkers: pool.threads, printWorkersIdle: pool.idleSize, printWorkersMax: pool.size, printCacheMaxBytes: WORKER_CACHE_BYTES }));
	defineJobs(database.db);
	if (config.databaseUrl) useJobQueue(await sharedQueue(config.databaseUrl));
	else await closeJobsLeftOpen(database.db);
	const stopSweeping = startSweeping(database.db);
	// After a busy spell the heap's garbage goes back to the system once requests stop.
	const stopCollecting = collectWhenQuiet();
	const runtime: Runtime = { database, stopCatcher: mail.stop, catching: mail.catching };
	const stop = async () => {
		stopSweeping();
		stopCollecting();
		// Running builds finish (or, past the wait, are left for another process to retry); odds
		// runs, which can be long, stop now (taken up again elsewhere on a shared queue).
		stopOddsRunsHere();
		await jobQueue().stop();
		await closePrintPool();
		await runtime.stopCatcher?.();
		await database.close();
	};
	process.once('sveltekit:shutdown', () => void stop());
	// The start-up log: where to open the app and, in demo mode, how to sign in.
	console.log(`Paddock is ready: open ${config.origin}`);
	if (demoNote) console.log(demoNote);
	return runtime;
}

export function startRuntime(): Promise<Runtime> {
	slot.__paddock ??= start();
	return slot.__paddock;
}

/** Tests put their own (in-memory) database here. */
export function useRuntime(database: Database, catching = true) {
	defineJobs(database.db);
	slot.__paddock = Promise.resolve({ database, catching });
}

export async function db(): Promise<Db> {
	return (await startRuntime()).database.db;
}

export async function mailIsCaught(): Promise<boolean> {
	return (await startRuntime()).catching;
}
