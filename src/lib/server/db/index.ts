/**
 * Opening the database: embedded PGlite in a data directory (or in memory for tests), with the
 * drizzle-kit migrations applied. The schema is plain PostgreSQL, so a PostgreSQL server behind
 * DATABASE_URL can take the same migrations when the app runs as several processes.
 */
import { PGlite } from '@electric-sql/pglite';
import { drizzle, type PgliteDatabase } from 'drizzle-orm/pglite';
import { migrate } from 'drizzle-orm/pglite/migrator';
import { resolve } from 'node:path';
import * as schema from './schema';
import { lockDataDir } from './lock';

export type Db = PgliteDatabase<typeof schema>;

export interface Database {
	db: Db;
	close: () => Promise<void>;
}

export const MIGRATIONS_DIR = resolve(process.env.PADDOCK_MIGRATIONS_DIR ?? 'drizzle');

/** `dataDir: null` opens a throw-away in-memory database. */
export async function openDatabase(dataDir: string | null): Promise<Database> {
	const release = dataDir ? lockDataDir(dataDir) : () => {};
	try {
		const client = dataDir ? new PGlite(resolve(dataDir, 'pg')) : new PGlite();
		await client.waitReady;
		const db = drizzle({ client, schema });
		await migrate(db, { migrationsFolder: MIGRATIONS_DIR });
		return {
			db,
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

export { schema };
