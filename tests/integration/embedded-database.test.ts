/**
 * The embedded database in a data directory: a new directory is made (in a thread of its own),
 * keeps what was written when opened again, and runs with the small buffer pool chosen for it
 * (Postgres reports its own setting through SHOW, PostgreSQL 15 manual §20.4.1).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { openDatabase } from '$lib/server/db';

const dir = mkdtempSync(join(tmpdir(), 'paddock-embedded-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const rows = (r: unknown) => ((r as { rows?: Record<string, unknown>[] }).rows ?? (r as Record<string, unknown>[]));

describe('the embedded database', () => {
	it('makes a new data directory, keeps its rows and runs with a 16 MB buffer pool', async () => {
		const first = await openDatabase(dir);
		try {
			await first.db.execute(sql`create table kept (n integer)`);
			await first.db.execute(sql`insert into kept values (7)`);
		} finally {
			await first.close();
		}
		const again = await openDatabase(dir);
		try {
			expect(rows(await again.db.execute(sql`select n from kept`))).toEqual([{ n: 7 }]);
			expect(rows(await again.db.execute(sql`show shared_buffers`))).toEqual([{ shared_buffers: '16MB' }]);
		} finally {
			await again.close();
		}
	}, 120_000);
});
