/**
 * Drizzle reads dates, times and intervals as the text Postgres sends and makes its own values
 * from it, and tells the embedded client so with every query: a map of nine parsers that each
 * hand back the text they are given. PGlite merges that map into its own (some 320 types) for
 * every query, and on the server's thread the merge made more garbage than the rest of the
 * query's JavaScript: some 120 KB of 170 KB, and a quarter of its time (a one-row select).
 *
 * So the client is given those parsers once, and a query that brings only parsers the client
 * already has leaves them out. Any other parser a query brings is kept, and merged as before.
 */
import { types, type PGlite, type Transaction } from '@electric-sql/pglite';

const asText = (value: string) => value;

/** Text no parser of a real type would hand back unchanged, unless it hands back whatever it is given. */
const PROBE = '\u0000text-as-given';

type QueryOptions = NonNullable<Parameters<PGlite['query']>[2]>;
type Parsers = NonNullable<QueryOptions['parsers']>;

/**
 * The types drizzle reads as text (its parsers in drizzle-orm/pglite/session.js): then numeric[],
 * timestamp[], timestamptz[], interval[] and date[] by their type ids (Postgres's pg_type.dat).
 */
const TEXT_TYPES = [types.TIMESTAMP, types.TIMESTAMPTZ, types.INTERVAL, types.DATE, 1231, 1115, 1185, 1187, 1182];

/** The query's options without parsers the client already applies the same way. */
function withoutKnownParsers(client: PGlite, options: QueryOptions | undefined): QueryOptions | undefined {
	const given = options?.parsers;
	if (!given) return options;
	// Read at each query: PGlite replaces its map when it learns new types (array types among them).
	const known = client.parsers as Parsers;
	for (const [type, parser] of Object.entries(given)) {
		if (known[Number(type)] !== asText || parser(PROBE, Number(type)) !== PROBE) return options;
	}
	const { parsers: _same, ...rest } = options;
	return rest;
}

/**
 * Installs drizzle's text parsers on the client, and drops them from each query (on the client
 * and inside its transactions). Call after the client is ready and before anything wraps it.
 */
export function readTextOnce(client: PGlite): void {
	const parsers = client.parsers as Parsers;
	for (const type of TEXT_TYPES) parsers[type] = asText;
	const query = client.query.bind(client);
	const transaction = client.transaction.bind(client);
	client.query = ((text: string, params?: unknown[], options?: QueryOptions) => query(text, params, withoutKnownParsers(client, options))) as PGlite['query'];
	client.transaction = (<T>(callback: (tx: Transaction) => Promise<T>) =>
		transaction((tx) => {
			const inner = tx.query.bind(tx);
			const lean = Object.create(tx, {
				query: {
					value: (text: string, params?: unknown[], options?: QueryOptions) => inner(text, params, withoutKnownParsers(client, options)),
					writable: true,
					configurable: true
				}
			}) as Transaction;
			return callback(lean);
		})) as PGlite['transaction'];
}
