/**
 * The bound on queued print jobs (sheet PDFs, PNG zips). The jobs waiting or running are counted
 * in their database rows, so one bound holds across every app process sharing the database
 * (whether jobs run in this process's worker pool or through the shared queue). Past the bound a
 * new job is refused before its row is written (nothing half-made), with an estimate of when a
 * place frees up. On a database server the count and the insert run under one advisory lock, so
 * two processes admitting at the same moment cannot both take the last place (the embedded
 * database runs one transaction at a time already).
 */
import { count, inArray, sql } from 'drizzle-orm';
import { isEmbedded, type Db } from './db';
import { printJobs } from './db/schema';
import { Busy } from './refusals';
import { countSetting } from '../settings';

/** Print jobs queued or running at once, across all processes (PADDOCK_PRINT_QUEUE_MAX). */
export const DEFAULT_PRINT_QUEUE_MAX = 16;

export function printQueueMax(): number {
	return countSetting(process.env.PADDOCK_PRINT_QUEUE_MAX, DEFAULT_PRINT_QUEUE_MAX);
}

/** The advisory lock's key for admitting print jobs (any fixed number, the same in every process). */
const ADMIT_LOCK = sql.raw(`${BigInt.asIntN(64, 0x70616464_6f636b02n)}`);

/** Until this process has timed a build, a build is taken to last this long. */
const ASSUMED_BUILD_S = 10;
/** Retry-After stays within these bounds (seconds). */
const RETRY_MIN_S = 1;
const RETRY_MAX_S = 300;

/** A moving average of how long this process's builds took, seconds. */
let buildSeconds = ASSUMED_BUILD_S;

/** Records a finished build's duration (for the estimate in a refusal). */
export function noteBuildSeconds(seconds: number): void {
	if (!Number.isFinite(seconds) || seconds < 0) return;
	buildSeconds = 0.8 * buildSeconds + 0.2 * seconds;
}

/**
 * Seconds until a place frees: the running builds finish one about every `build ÷ running`
 * seconds; with none running (all waiting for a worker), about one build.
 */
export function retryAfterSeconds(running: number, averageBuildS = buildSeconds): number {
	const s = averageBuildS / Math.max(1, running);
	return Math.min(RETRY_MAX_S, Math.max(RETRY_MIN_S, Math.ceil(s)));
}

/** The print queue is full: try again after `retryAfterS` seconds (HTTP 503 with Retry-After). */
export class PrintQueueFull extends Busy {
	constructor(
		readonly open: number,
		readonly retryAfterS: number
	) {
		super(`The print queue is full (${open} ${open === 1 ? 'build' : 'builds'} waiting or running); try again in ${retryAfterS} s`);
	}
}

/**
 * Writes a print job's row with `insert` if the queue has room; throws PrintQueueFull (and
 * writes nothing) when it has none. Runs inside the caller's transaction `tx`, whose end
 * releases the lock.
 */
export async function admitPrintJob<T>(tx: Db, insert: () => Promise<T>, max = printQueueMax()): Promise<T> {
	if (!isEmbedded(tx)) await tx.execute(sql`select pg_advisory_xact_lock(${ADMIT_LOCK})`);
	const rows = await tx
		.select({ state: printJobs.state, n: count() })
		.from(printJobs)
		.where(inArray(printJobs.state, ['queued', 'running']))
		.groupBy(printJobs.state);
	const open = rows.reduce((n, r) => n + r.n, 0);
	if (open >= max) throw new PrintQueueFull(open, retryAfterSeconds(rows.find((r) => r.state === 'running')?.n ?? 0));
	return insert();
}
