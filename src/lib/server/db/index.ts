/**
 * Opening the database: embedded PGlite in a data directory (or in memory for tests), or a
 * PostgreSQL server behind DATABASE_URL when the app runs as several processes. Both take the
 * same schema and the same drizzle-kit migrations.
 */
import { PGlite } from '@electric-sql/pglite';
import { drizzle as drizzlePglite, PgliteDatabase, PgliteTransaction } from 'drizzle-orm/pglite';
import { migrate as migratePglite } from 'drizzle-orm/pglite/migrator';
import { drizzle as drizzlePg } from 'drizzle-orm/node-postgres';
import { migrate as migratePg } from 'drizzle-orm/node-postgres/migrator';
import type { PgDatabase, PgQueryResultHKT } from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import pg from 'pg';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { Worker } from 'node:worker_threads';
import * as schema from './schema';
import { lockDataDir } from './lock';
import { takeTurns } from './turns';
import { readTextOnce } from './text-types';
import { describeServerError, serverName } from './server-errors';
import { countSetting } from '../../settings';

export type Db = PgDatabase<PgQueryResultHKT, typeof schema>;

export interface Database {
	db: Db;
	/** 'server' when behind DATABASE_URL: shared with other processes. */
	kind: 'embedded' | 'server';
	/** The server's address (with its password: never print it), when kind is 'server'. */
	url?: string;
	/** Throws when the database does not answer (readiness checks). */
	ping: () => Promise<void>;
	/** Runs `work` while no other process runs its own (start-up steps such as the demo seed). */
	exclusive: <T>(work: () => Promise<T>) => Promise<T>;
	/** Applies the migrations of a folder (done at open; upgrade tests call it again). */
	migrate: (migrationsFolder: string) => Promise<void>;
	close: () => Promise<void>;
}

/**
 * Whether `db` (or a transaction on it) is the embedded database. One process holds it, its calls
 * run one at a time and a transaction is one call (./turns.ts): nothing comes between a
 * transaction's statements, so the advisory locks that keep server processes apart are not taken.
 */
export const isEmbedded = (db: Db) => db instanceof PgliteDatabase || db instanceof PgliteTransaction;

export const MIGRATIONS_DIR = resolve(process.env.PADDOCK_MIGRATIONS_DIR ?? 'drizzle');

/**
 * Postgres sizes its buffer pool for a server of its own (128 MB); embedded, every megabyte of it
 * stays in the process for good. A small team's data fits a much smaller pool.
 */
const EMBEDDED_PARAMS = [...PGlite.defaultStartParams, '-c', 'shared_buffers=16MB', '-c', 'wal_buffers=1MB'];

/**
 * A new data directory is made in a thread of its own: making one runs a second Postgres
 * (initdb) whose memory is never given back, so it goes with the thread.
 */
async function initDataDir(dir: string): Promise<void> {
	const code = `
const { parentPort, workerData } = require('node:worker_threads');
import(workerData.pglite).then(async ({ PGlite }) => {
	const db = await PGlite.create({ dataDir: workerData.dir, startParams: workerData.params });
	await db.close();
	parentPort.postMessage('made');
});
`;
	const worker = new Worker(code, { eval: true, workerData: { dir, params: EMBEDDED_PARAMS, pglite: import.meta.resolve('@electric-sql/pglite') } });
	try {
		await new Promise<void>((ok, fail) => {
			worker.once('message', () => ok());
			worker.once('error', fail);
			worker.once('exit', (code) => fail(new Error(`making the database stopped (exit code ${code})`)));
		});
	} finally {
		await worker.terminate();
	}
}

/** `dataDir: null` opens a throw-away in-memory database. */
export async function openDatabase(dataDir: string | null, migrationsFolder = MIGRATIONS_DIR): Promise<Database> {
	const release = dataDir ? lockDataDir(dataDir) : () => {};
	try {
		const pgDir = dataDir && resolve(dataDir, 'pg');
		if (pgDir && !existsSync(resolve(pgDir, 'PG_VERSION'))) await initDataDir(pgDir);
		const client = new PGlite(pgDir ?? undefined, { startParams: EMBEDDED_PARAMS });
		await client.waitReady;
		readTextOnce(client);
		takeTurns(client);
		const db = drizzlePglite({ client, schema });
		const migrate = (folder: string) => migratePglite(db, { migrationsFolder: folder });
		await migrate(migrationsFolder);
		return {
			db: db as unknown as Db,
			kind: 'embedded',
			ping: async () => void (await client.query('select 1')),
			exclusive: (work) => work(),
			migrate,
			close: async () => {
				await client.close();
				release();
			}
		};
	} catch (e) {
		release();
		throw e;
	}
}

/** Any number for pg_advisory_lock, the same in every process: "paddock start-up". */
const START_LOCK = 7_461_829_301;

export class DatabaseUnreachableError extends Error {}

export interface ServerOptions {
	/** Connections this process keeps open at most. */
	poolSize?: number;
	migrationsFolder?: string;
}

/**
 * A PostgreSQL server: a connection pool, the migrations applied under an advisory lock so two
 * processes starting at once never run them twice. Connection failures become one clear message
 * naming the server (never the password).
 */
export async function connectDatabase(url: string, options: ServerOptions = {}): Promise<Database> {
	const pool = new pg.Pool({
		connectionString: url,
		max: options.poolSize ?? countSetting(process.env.DATABASE_POOL_SIZE, 10),
		connectionTimeoutMillis: 10_000,
		idleTimeoutMillis: 30_000
	});
	// An idle connection dropped by the server must not take the process down.
	pool.on('error', (e) => console.error(`Database connection lost (${serverName(url)}): ${e.message}`));
	let client: pg.PoolClient;
	try {
		client = await pool.connect();
	} catch (e) {
		await pool.end().catch(() => {});
		throw new DatabaseUnreachableError(describeServerError(url, e));
	}
	const db = drizzlePg({ client: pool, schema });
	const exclusive = async <T>(work: (client: pg.PoolClient) => Promise<T>, held?: pg.PoolClient): Promise<T> => {
		const c = held ?? (await pool.connect());
		try {
			await c.query('select pg_advisory_lock($1)', [START_LOCK]);
			try {
				return await work(c);
			} finally {
				await c.query('select pg_advisory_unlock($1)', [START_LOCK]);
			}
		} finally {
			c.release();
		}
	};
	const migrate = (folder: string, held?: pg.PoolClient) =>
		exclusive((c) => migratePg(drizzlePg({ client: c, schema }), { migrationsFolder: folder }), held);
	await migrate(options.migrationsFolder ?? MIGRATIONS_DIR, client);
	return {
		db: db as unknown as Db,
		kind: 'server',
		url,
		ping: async () => void (await db.execute(sql`select 1`)),
		exclusive: (work) => exclusive(() => work()),
		migrate: (folder) => migrate(folder),
		close: () => pool.end()
	};
}

/** DATABASE_URL when set, otherwise PGlite in the data directory. */
export function openConfiguredDatabase(databaseUrl: string | null, dataDir: string): Promise<Database> {
	return databaseUrl ? connectDatabase(databaseUrl) : openDatabase(dataDir);
}

export { schema };
