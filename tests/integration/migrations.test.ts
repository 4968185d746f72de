/**
 * Upgrading keeps data: a database at the previous migration, filled with the demo (every row
 * the demo makes in the tables that migration knows), takes the newest migration and still holds
 * every row and value, and the app reads its game as before. Runs on PGlite and, in the second
 * pass, on the PostgreSQL server.
 */
import { describe, it, expect, afterAll } from 'vitest';
import { cpSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { sql } from 'drizzle-orm';
import { MIGRATIONS_DIR, type Database, type Db } from '$lib/server/db';
import { seedDemo } from '$lib/server/demo';
import { loadGame } from '$lib/server/game-store';
import { openTestDatabase, testStorage } from './harness';
import { startMail } from '$lib/server/runtime';
import { useStorage } from '$lib/server/storage';

type Row = Record<string, unknown>;

async function rows<T extends Row>(db: Db, query: ReturnType<typeof sql>): Promise<T[]> {
	const result = (await db.execute(query)) as unknown as { rows: T[] };
	return result.rows;
}

const tablesOf = async (db: Db) =>
	(await rows<{ table_name: string }>(db, sql`select table_name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' order by 1`)).map(
		(r) => r.table_name
	);

const contents = async (db: Db, table: string) =>
	(await rows<{ r: Row }>(db, sql`select to_jsonb(t) as r from ${sql.identifier(table)} t`)).map((x) => x.r);

/** The migrations folder without its newest entry. */
function previousMigrations(): { folder: string; newest: string } {
	const folder = mkdtempSync(join(tmpdir(), 'paddock-migrations-'));
	cpSync(MIGRATIONS_DIR, folder, { recursive: true });
	const journalPath = join(folder, 'meta', '_journal.json');
	const journal = JSON.parse(readFileSync(journalPath, 'utf8'));
	const newest = journal.entries.pop().tag;
	writeFileSync(journalPath, JSON.stringify(journal));
	return { folder, newest };
}

const sortKey = (r: Row) => JSON.stringify(Object.keys(r).sort().map((k) => [k, r[k]]));

describe('upgrading from the previous migration', () => {
	const open: Database[] = [];
	let stopMail: (() => Promise<void>) | undefined;
	afterAll(async () => {
		await stopMail?.();
		for (const d of open) await d.close();
	});

	it('keeps every row and value, and the game reads the same', async () => {
		useStorage(testStorage());
		const { folder, newest } = previousMigrations();

		// The reference: the demo in a database at the newest migration.
		const reference = await openTestDatabase();
		open.push(reference);
		stopMail = (await startMail(reference.db, null)).stop;
		await seedDemo(reference.db);

		// The same rows written into a database one migration behind (its own columns only).
		const old = await openTestDatabase(folder);
		open.push(old);
		const oldTables = await tablesOf(old.db);
		const newTables = await tablesOf(reference.db);
		expect(oldTables.length, `${newest} should not be the only migration`).toBeGreaterThan(0);
		const before = new Map<string, Row[]>();
		await old.db.transaction(async (tx) => {
			// Foreign keys are checked by the real data's shape, not by insert order.
			await tx.execute(sql`set local session_replication_role = replica`);
			for (const table of oldTables) {
				if (!newTables.includes(table)) continue;
				for (const r of await contents(reference.db, table)) {
					await tx.execute(
						sql`insert into ${sql.identifier(table)} select * from jsonb_populate_record(null::${sql.identifier(table)}, ${JSON.stringify(r)}::jsonb)`
					);
				}
			}
		});
		for (const table of oldTables) before.set(table, await contents(old.db, table));
		const filled = [...before.values()].filter((r) => r.length > 0).length;
		expect(filled).toBeGreaterThan(5);

		await old.migrate(MIGRATIONS_DIR);

		expect(await tablesOf(old.db)).toEqual(newTables);
		for (const [table, was] of before) {
			const now = await contents(old.db, table);
			expect(now.length, table).toBe(was.length);
			// Each old row is still there with its old values (new columns may have been added).
			const keep = (r: Row, keys: string[]) => Object.fromEntries(keys.map((k) => [k, r[k]]));
			const keys = was.length ? Object.keys(was[0]) : [];
			expect(now.map((r) => keep(r, keys)).map(sortKey).sort(), table).toEqual(was.map(sortKey).sort());
		}
		const [{ id }] = await rows<{ id: string }>(old.db, sql`select id from games limit 1`);
		expect(await loadGame(old.db, id)).toEqual(await loadGame(reference.db, id));
	});
});
