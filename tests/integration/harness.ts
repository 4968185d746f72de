/**
 * Integration tests run the real route modules against an in-memory PGlite with the real
 * migrations, the demo seed and the local mail catcher. A request is a plain Request plus the
 * RequestEvent fields our handlers read; `locals.user` says who is calling.
 */
import { isHttpError, isRedirect, isActionFailure } from '@sveltejs/kit';
import { stringify } from 'devalue';
import { openDatabase, connectDatabase, type Database, type Db } from '$lib/server/db';
import { useRuntime, startMail } from '$lib/server/runtime';
import { inProcessQueue, sharedQueue, useJobQueue, type JobQueue } from '$lib/server/job-queue';
import { seedDemo, DEMO_ROLES, demoEmail } from '$lib/server/demo';
import { findUserByEmail, createUser } from '$lib/server/users';
import { createTeam } from '$lib/server/teams';
import { gameActorOf, type GameActor } from '$lib/server/actor';
import { games, type Role } from '$lib/server/db/schema';
import { useStorage, storageFor, type Storage } from '$lib/server/storage';
import { mkdtempSync } from 'node:fs';
import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export type Who = Role | 'anonymous' | 'outsider';
export const EVERYONE: Who[] = [...DEMO_ROLES, 'anonymous', 'outsider'];

export interface Caller {
	id: string;
	email: string;
	name: string;
}

export interface World {
	db: Db;
	teamId: string;
	gameId: string;
	outsiderTeamId: string;
	callers: Record<Who, Caller | null>;
	/** The PostgreSQL database's address on the server pass (for a second connection). */
	databaseUrl?: string;
	close: () => Promise<void>;
}

export async function openWorld(): Promise<World> {
	useStorage(testStorage());
	const database = await openTestDatabase();
	const mail = await startMail(database.db, null);
	useRuntime(database, true);
	// Jobs through pg-boss on the server (the second pass), in this process on PGlite.
	const jobs: JobQueue = database.kind === 'server' && database.url ? await sharedQueue(database.url, { maintenanceSeconds: 2, expireSeconds: 30 }) : inProcessQueue();
	useJobQueue(jobs);
	await seedDemo(database.db);
	const callers = { anonymous: null } as Record<Who, Caller | null>;
	for (const role of DEMO_ROLES) {
		const u = (await findUserByEmail(database.db, demoEmail(role)))!;
		callers[role] = { id: u.id, email: u.email, name: u.name };
	}
	const outsider = await createUser(database.db, {
		email: 'outsider@elsewhere.test',
		name: 'Out Sider',
		password: 'outsider-pass-1'
	});
	callers.outsider = { id: outsider.id, email: outsider.email, name: outsider.name };
	const outsiderTeam = await createTeam(database.db, { userId: outsider.id, name: outsider.name }, { name: 'Elsewhere Games' });
	const [game] = await database.db.select().from(games);
	return {
		db: database.db,
		teamId: game.teamId,
		gameId: game.id,
		outsiderTeamId: outsiderTeam.id,
		callers,
		databaseUrl: database.kind === 'server' ? database.url : undefined,
		close: async () => {
			await jobs.stop(20_000);
			await mail.stop?.();
			await database.close();
		}
	};
}

/**
 * A file store of its own, empty: a temp directory, or, when PADDOCK_TEST_STORAGE_URL names a
 * bucket (the second pass), a fresh prefix in that bucket.
 */
export function testStorage(): Storage {
	const bucket = process.env.PADDOCK_TEST_STORAGE_URL;
	if (!bucket) return storageFor(null, mkdtempSync(join(tmpdir(), 'paddock-files-')));
	const url = new URL(bucket);
	url.pathname = `/${randomUUID()}`;
	return storageFor(url.toString(), '');
}

/**
 * In-memory PGlite, or, when PADDOCK_TEST_DATABASE_URL names a PostgreSQL server (the second
 * pass of the suite), a database of its own on that server, dropped when the world closes.
 */
export async function openTestDatabase(migrationsFolder?: string): Promise<Database> {
	const server = process.env.PADDOCK_TEST_DATABASE_URL;
	if (!server) return openDatabase(null, migrationsFolder);
	const name = `paddock_test_${randomUUID().replaceAll('-', '')}`;
	const admin = async (sql: string) => {
		const client = new pg.Client(server);
		await client.connect();
		try {
			await client.query(sql);
		} finally {
			await client.end();
		}
	};
	await admin(`create database ${name}`);
	const url = new URL(server);
	url.pathname = `/${name}`;
	const database = await connectDatabase(url.toString(), { poolSize: 4, migrationsFolder });
	return {
		...database,
		close: async () => {
			await database.close();
			await admin(`drop database ${name} with (force)`);
		}
	};
}

interface Call {
	method?: string;
	path?: string;
	params?: Record<string, string>;
	json?: unknown;
	form?: Record<string, string | Blob>;
	body?: BodyInit;
	headers?: Record<string, string>;
}

export function fakeEvent(user: Caller | null, call: Call = {}) {
	const url = new URL(call.path ?? '/', 'http://localhost:3000');
	const headers = new Headers(call.headers);
	let body: BodyInit | undefined = call.body;
	if (call.json !== undefined) {
		headers.set('content-type', 'application/json');
		body = JSON.stringify(call.json);
	} else if (call.form) {
		const fd = new FormData();
		for (const [k, v] of Object.entries(call.form)) fd.set(k, v);
		body = fd;
	}
	const jar = new Map<string, string>();
	return {
		request: new Request(url, { method: call.method ?? (body ? 'POST' : 'GET'), headers, body }),
		url,
		params: call.params ?? {},
		route: { id: null },
		locals: { user, via: user ? ('cookie' as const) : undefined, auth: async () => null },
		cookies: {
			get: (n: string) => jar.get(n),
			getAll: () => [...jar].map(([name, value]) => ({ name, value })),
			set: (n: string, v: string) => void jar.set(n, v),
			delete: (n: string) => void jar.delete(n),
			serialize: () => ''
		},
		getClientAddress: () => '127.0.0.1',
		setHeaders: () => {},
		fetch,
		platform: undefined,
		isDataRequest: false,
		isSubRequest: false,
		isRemoteRequest: false,
		tracing: { enabled: false, root: {}, current: {} }
	};
}

/** Runs a load, action or API handler and reports the HTTP status it amounts to. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export async function statusOf(run: () => unknown): Promise<number> {
	try {
		const result = await run();
		if (result instanceof Response) return result.status;
		if (isActionFailure(result)) return result.status;
		return 200;
	} catch (e) {
		if (isHttpError(e)) return e.status;
		if (isRedirect(e)) return e.status;
		throw e;
	}
}


/** The body superforms posts for `dataType: 'json'` forms. */
export function superformJson(data: unknown): Record<string, string> {
	return { __superform_json: stringify(data) };
}

/** A demo member acting on a game of the demo team (the demo game unless named), as the guard would hand a service. */
export function actorIn(w: World, role: Role = 'designer', gameId = w.gameId): GameActor {
	return gameActorOf(w.callers[role]!, role, { id: gameId, teamId: w.teamId });
}
