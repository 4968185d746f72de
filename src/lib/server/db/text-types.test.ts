/**
 * Drizzle's reading of dates, times and intervals is unchanged when the client holds its text
 * parsers and queries leave theirs out. The reference is drizzle itself on a client left as it
 * comes, reading the same rows.
 */
import { PGlite, types } from '@electric-sql/pglite';
import { eq } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/pglite';
import { date, integer, interval, pgTable, timestamp } from 'drizzle-orm/pg-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readTextOnce } from './text-types';

const moments = pgTable('moments', {
	id: integer('id').primaryKey(),
	at: timestamp('at', { withTimezone: true }).notNull(),
	local: timestamp('local').notNull(),
	localText: timestamp('local_text', { mode: 'string' }).notNull(),
	day: date('day').notNull(),
	span: interval('span').notNull()
});

const CREATE = `create table moments (id integer primary key, at timestamptz not null, local timestamp not null,
	local_text timestamp not null, day date not null, span interval not null)`;
const ROWS = [
	{ id: 1, at: new Date('2026-03-29T01:30:00.123Z'), local: new Date('1999-12-31T23:59:59.999Z'), localText: '2024-02-29 12:00:00', day: '2024-02-29', span: '1 day 02:03:04' },
	{ id: 2, at: new Date('1970-01-01T00:00:00Z'), local: new Date('2038-01-19T03:14:08Z'), localText: '1900-01-01 00:00:00', day: '0001-01-01', span: '-3 mons' }
];

async function open(lean: boolean) {
	const client = new PGlite();
	await client.waitReady;
	const seen: (object | undefined)[] = [];
	const query = client.query.bind(client);
	client.query = ((text: string, params?: unknown[], options?: object) => {
		seen.push(options);
		return query(text, params, options);
	}) as PGlite['query'];
	if (lean) readTextOnce(client);
	await client.exec(CREATE);
	const db = drizzle({ client });
	await db.insert(moments).values(ROWS);
	return { client, db, seen };
}

describe("drizzle's text types read once by the embedded client", () => {
	let plain: Awaited<ReturnType<typeof open>>;
	let lean: Awaited<ReturnType<typeof open>>;
	beforeAll(async () => {
		[plain, lean] = await Promise.all([open(false), open(true)]);
	});
	afterAll(async () => {
		await Promise.all([plain.client.close(), lean.client.close()]);
	});

	it('reads the same values as drizzle on a client left as it comes, in and out of transactions', async () => {
		const read = (db: typeof plain.db) => db.select().from(moments).orderBy(moments.id);
		const expected = await read(plain.db);
		expect(expected.map((r) => r.at.toISOString())).toEqual(ROWS.map((r) => r.at.toISOString()));
		expect(await read(lean.db)).toEqual(expected);
		expect(await lean.db.transaction((tx) => tx.select().from(moments).orderBy(moments.id))).toEqual(expected);
		const [one] = await lean.db.update(moments).set({ span: '5 minutes' }).where(eq(moments.id, 2)).returning();
		expect(one.span).toBe('00:05:00');
	});

	it('leaves out the parsers the client holds, and keeps any other', async () => {
		lean.seen.length = 0;
		await lean.db.select().from(moments);
		expect(lean.seen.length).toBe(1);
		expect(lean.seen[0]).not.toHaveProperty('parsers');
		// A query's own parser for a type, different from the client's, still wins.
		const other = await lean.client.query<{ at: string }>('select at from moments where id = 1', [], {
			parsers: { [types.TIMESTAMPTZ]: () => 'its own' }
		});
		expect(other.rows[0].at).toBe('its own');
		const json = await lean.client.query<{ j: string }>(`select '{"a":1}'::jsonb as j`, [], { parsers: { [types.JSONB]: (text: string) => `raw ${text}` } });
		expect(json.rows[0].j).toBe('raw {"a": 1}');
	});
});
