/**
 * API throughput on one and on two app processes over PostgreSQL (`npm run bench:cluster`, also
 * part of `npm run bench`): a throw-away PostgreSQL server and local bucket, the built app, the
 * demo data; for a fixed time, concurrent clients GET the team's game list, then save objects
 * (PUT, each client its own object, each save naming the version it read). The same load on one
 * process, then spread over two: requests per second and the ratio two / one.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
// @ts-expect-error plain JavaScript helpers shared with the test set-up
import { startPostgres, startBucket } from '../services.js';
// @ts-expect-error plain JavaScript helper shared with `npm start`
import { buildAppIfStale } from '../build-if-stale.js';

const PORT = Number(process.env.BENCH_PORT ?? process.env.E2E_PORT ?? 4450) + 10;
const SECONDS = Number(process.env.BENCH_CLUSTER_SECONDS ?? 8);
const CLIENTS = Number(process.env.BENCH_CLUSTER_CLIENTS ?? 8);

export interface ClusterBench {
	cores: number;
	loadAverage: number;
	seconds: number;
	clients: number;
	list: { oneProcess: number; twoProcesses: number; ratio: number };
	save: { oneProcess: number; twoProcesses: number; ratio: number };
}

async function ready(origin: string, child: ChildProcess) {
	for (let i = 0; i < 1200; i++) {
		if (child.exitCode !== null) throw new Error(`the app on ${origin} exited`);
		try {
			if ((await fetch(`${origin}/readyz`)).ok) return;
		} catch {
			/* starting */
		}
		await new Promise((ok) => setTimeout(ok, 250));
	}
	throw new Error(`the app on ${origin} did not become ready`);
}

/** Requests per second of `clients` loops over `seconds`; each loop's request goes to the next origin in turn. */
async function rate(origins: string[], clients: number, request: (origin: string, client: number) => Promise<boolean>) {
	const until = performance.now() + SECONDS * 1000;
	let ok = 0;
	let failed = 0;
	await Promise.all(
		Array.from({ length: clients }, async (_, c) => {
			let n = c;
			while (performance.now() < until) {
				if (await request(origins[n++ % origins.length], c)) ok++;
				else failed++;
			}
		})
	);
	if (failed) console.log(`    (${failed} requests failed)`);
	return ok / SECONDS;
}

export async function benchCluster(): Promise<ClusterBench> {
	const load = loadavg()[0];
	console.log(`\nAPI throughput over PostgreSQL, 1 and 2 app processes (load average ${load.toFixed(1)} on ${availableParallelism()} cores):`);
	await buildAppIfStale({ log: () => {} });
	const pg = await startPostgres({ port: Number(process.env.PADDOCK_PG_PORT) || undefined });
	const bucket = await startBucket({ port: Number(process.env.PADDOCK_S3_PORT) || undefined });
	const children: ChildProcess[] = [];
	const env = {
		PATH: process.env.PATH ?? '',
		DATABASE_URL: pg.url,
		PADDOCK_STORAGE_URL: bucket.url,
		AUTH_SECRET: randomBytes(32).toString('base64url'),
		PADDOCK_DATA_DIR: mkdtempSync(join(tmpdir(), 'paddock-bench-cluster-')),
		PADDOCK_DEMO: '1'
	};
	const startApp = async (port: number) => {
		const origin = `http://localhost:${port}`;
		const child = spawn(process.execPath, ['build/index.js'], { env: { ...env, PORT: String(port), ORIGIN: origin }, stdio: 'ignore' });
		children.push(child);
		await ready(origin, child);
		return origin;
	};
	try {
		const a = await startApp(PORT);
		// An API token, as scripts use: no origin check, no cookie.
		const signIn = await fetch(`${a}/signin`, {
			method: 'POST',
			body: new URLSearchParams({ email: 'designer@paddock.test', password: 'paddock-demo' }),
			headers: { origin: a, 'content-type': 'application/x-www-form-urlencoded' },
			redirect: 'manual'
		});
		const cookie = signIn.headers
			.getSetCookie()
			.find((c) => /session-token=[^;]/.test(c))!
			.split(';')[0];
		const headers = (origin: string) => ({ cookie, origin, 'content-type': 'application/json' });
		const me = await (await fetch(`${a}/api/v1/me`, { headers: headers(a) })).json();
		const teamId = me.memberships[0].teamId;
		const gameId = (await (await fetch(`${a}/api/v1/teams/${teamId}/games`, { headers: headers(a) })).json()).games[0].id;
		// One money table per client, so saves never race each other.
		const tables: { id: string; version: number; body: Record<string, unknown> }[] = [];
		for (let c = 0; c < CLIENTS; c++) {
			const res = await fetch(`${a}/api/v1/games/${gameId}/money-tables`, {
				method: 'POST',
				headers: headers(a),
				body: JSON.stringify({ name: `Bench table ${c}`, rows: [{ place: 1, coins: 5 }], otherCoins: -1 })
			});
			const made = (await res.json()).moneyTable;
			if (!made) throw new Error(`could not make a money table (${res.status})`);
			tables.push({ id: made.id, version: made.version, body: made });
		}
		const list = (origin: string) => fetch(`${origin}/api/v1/teams/${teamId}/games`, { headers: headers(origin) }).then(async (r) => (await r.arrayBuffer(), r.ok));
		const save = async (origin: string, c: number) => {
			const t = tables[c];
			const r = await fetch(`${origin}/api/v1/games/${gameId}/money-tables/${t.id}`, {
				method: 'PUT',
				headers: headers(origin),
				body: JSON.stringify({ ...t.body, otherCoins: -1 - (t.version % 3), version: t.version })
			});
			if (!r.ok) return (await r.arrayBuffer(), false);
			t.version = (await r.json()).moneyTable.version;
			return true;
		};
		await rate([a], CLIENTS, list); // warm-up
		const list1 = await rate([a], CLIENTS, list);
		const save1 = await rate([a], CLIENTS, save);
		const b = await startApp(PORT + 1);
		await rate([a, b], CLIENTS, list); // warm-up of the second
		const list2 = await rate([a, b], CLIENTS, list);
		const save2 = await rate([a, b], CLIENTS, save);
		const round = (x: number) => Math.round(x * 10) / 10;
		const result: ClusterBench = {
			cores: availableParallelism(),
			loadAverage: round(load),
			seconds: SECONDS,
			clients: CLIENTS,
			list: { oneProcess: round(list1), twoProcesses: round(list2), ratio: round((list2 / list1) * 100) / 100 },
			save: { oneProcess: round(save1), twoProcesses: round(save2), ratio: round((save2 / save1) * 100) / 100 }
		};
		console.log(`  GET game list: ${result.list.oneProcess} req/s on 1 process, ${result.list.twoProcesses} on 2 (× ${result.list.ratio})`);
		console.log(`  save (PUT):    ${result.save.oneProcess} req/s on 1 process, ${result.save.twoProcesses} on 2 (× ${result.save.ratio})`);
		return result;
	} finally {
		for (const c of children) c.kill('SIGTERM');
		await Promise.all(children.map((c) => (c.exitCode !== null ? null : new Promise((ok) => c.once('exit', ok)))));
		await bucket.stop();
		await pg.stop();
	}
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
	benchCluster().then(
		(r) => console.log(JSON.stringify(r, null, '\t')),
		(e) => {
			console.error(e);
			process.exitCode = 1;
		}
	);
}
