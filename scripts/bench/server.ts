/**
 * The app as a whole process under HTTP load: the built server (`npm run build`) started on a
 * scratch data directory with the demo, signed in as the demo designer. Shared by the bench's
 * server section and the soak (scripts/soak.ts).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import autocannon from 'autocannon';

const ROOT = new URL('../..', import.meta.url).pathname;

export interface Vitals {
	rssMb: number;
	heapMb: number;
	loopDelayMs: { p50: number; p99: number; max: number };
	faceCache: { entries: number; bytes: number };
	printWorkersWarm: boolean;
}

export interface Server {
	url: string;
	pid: number;
	/** Whole-process RSS (every thread), from /proc. */
	rssMb(): number;
	/** The server's own figures (SIGUSR2, see src/lib/server/vitals.ts); resets its loop-delay histogram. */
	vitals(): Promise<Vitals>;
	stop(): Promise<void>;
}

/** `buildDir`: a copy of build/ to run (a long soak keeps running while build/ is rebuilt). */
export async function startServer(port: number, buildDir = 'build'): Promise<Server> {
	if (buildDir === 'build') {
		const { buildAppIfStale } = await import('../build-if-stale.js');
		await buildAppIfStale();
	}
	const dataDir = mkdtempSync(join(tmpdir(), 'paddock-bench-data-'));
	const url = `http://localhost:${port}`;
	const child: ChildProcess = spawn(process.execPath, [join(buildDir, 'index.js')], {
		cwd: ROOT,
		// The body limit `npm start` sets (scripts/start.js); the framework's own default refuses art uploads.
		env: { ...process.env, PORT: String(port), ORIGIN: url, PADDOCK_DATA_DIR: dataDir, PADDOCK_DEMO: '1', DATABASE_URL: '', BODY_SIZE_LIMIT: process.env.BODY_SIZE_LIMIT ?? '210M' },
		stdio: ['ignore', 'pipe', 'inherit']
	});
	let out = '';
	const waiters: ((line: string) => void)[] = [];
	child.stdout!.setEncoding('utf8').on('data', (d: string) => {
		out += d;
		let nl;
		while ((nl = out.indexOf('\n')) >= 0) {
			const line = out.slice(0, nl);
			out = out.slice(nl + 1);
			if (line.startsWith('paddock-vitals ')) waiters.shift()?.(line.slice('paddock-vitals '.length));
		}
	});
	const server: Server = {
		url,
		pid: child.pid!,
		rssMb: () => {
			const m = readFileSync(`/proc/${child.pid}/status`, 'utf8').match(/VmRSS:\s+(\d+) kB/);
			return m ? Math.round(Number(m[1]) / 1024) : NaN;
		},
		vitals: () =>
			new Promise((resolve) => {
				waiters.push((json) => resolve(JSON.parse(json)));
				child.kill('SIGUSR2');
			}),
		stop: async () => {
			child.kill('SIGTERM');
			await new Promise((r) => child.once('exit', r));
			rmSync(dataDir, { recursive: true, force: true });
		}
	};
	// Up when /api/v1/me answers (401 without a session).
	for (let i = 0; ; i++) {
		try {
			await fetch(`${url}/api/v1/me`);
			break;
		} catch {
			if (i > 600) throw new Error('the server did not start');
			await sleep(250);
		}
	}
	return server;
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** A signed-in session (the sign-in form, as a browser posts it) and the demo game. */
export async function signIn(url: string, email = 'designer@paddock.test') {
	const res = await fetch(`${url}/signin`, {
		method: 'POST',
		redirect: 'manual',
		headers: { origin: url, 'content-type': 'application/x-www-form-urlencoded' },
		body: new URLSearchParams({ email, password: 'paddock-demo' })
	});
	const cookie = res.headers
		.getSetCookie()
		.map((c) => c.split(';')[0])
		.join('; ');
	const headers = { cookie, origin: url };
	const me = (await (await fetch(`${url}/api/v1/me`, { headers })).json()) as { memberships: { teamId: string }[] };
	const games = (await (await fetch(`${url}/api/v1/teams/${me.memberships[0].teamId}/games`, { headers })).json()) as { games: { id: string }[] };
	const gameId = games.games[0].id;
	const cards = (await (await fetch(`${url}/api/v1/games/${gameId}/cards`, { headers })).json()) as {
		cards: { id: string; name: string; version: number; kindId: string; data: unknown; copies: number }[];
	};
	return { headers, gameId, cards: cards.cards };
}
export type Session = Awaited<ReturnType<typeof signIn>>;

/** Wall time of one request (body read), ms. */
export async function timeRequest(url: string, init: RequestInit = {}): Promise<{ ms: number; status: number; res: Response }> {
	const t = performance.now();
	const res = await fetch(url, init);
	await res.arrayBuffer();
	return { ms: performance.now() - t, status: res.status, res };
}

/** Latency under `connections` concurrent clients for `seconds` (autocannon). */
export async function loadTest(url: string, headers: Record<string, string>, connections: number, seconds: number) {
	const r = await autocannon({ url, headers, connections, duration: seconds });
	return { p50: r.latency.p50, p99: r.latency.p99, requests: r.requests.total, non2xx: r.non2xx };
}

export const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** A sheet build through the print page's job route, followed to the end; ms from start to file. */
export async function sheetJob(s: Session, url: string, query: Record<string, string>, kind: 'sheets' | 'pngs' = 'sheets') {
	const t = performance.now();
	const res = await fetch(`${url}/api/v1/games/${s.gameId}/print-jobs`, {
		method: 'POST',
		headers: { ...s.headers, 'content-type': 'application/json' },
		body: JSON.stringify({ kind, query })
	});
	if (res.status !== 202) return { status: res.status, retryAfter: res.headers.get('retry-after'), ms: performance.now() - t };
	const job = (await res.json()) as { id: string };
	for (;;) {
		const state = (await (await fetch(`${url}/api/v1/print-jobs/${job.id}`, { headers: s.headers })).json()) as { state: string };
		if (state.state === 'done' || state.state === 'failed') {
			const file = await fetch(`${url}/api/v1/print-jobs/${job.id}/file`, { headers: s.headers });
			const bytes = (await file.arrayBuffer()).byteLength;
			return { status: file.status, ms: performance.now() - t, bytes, state: state.state };
		}
		await sleep(50);
	}
}

/**
 * The mixed load of a working day, for `ms`: `clients` people reading faces and pages, one of
 * them editing a card now and then (new faces for the caches), a sheet build every ~20 s and a
 * PNG zip every ~2 min.
 */
export async function mixedLoad(server: Server, s: Session, ms: number, clients = 4) {
	const end = Date.now() + ms;
	const etags = new Map<string, string>();
	let requests = 0;
	let errors = 0;
	const pick = <T>(xs: T[]) => xs[Math.floor(Math.random() * xs.length)];
	const reader = async () => {
		while (Date.now() < end) {
			const card = pick(s.cards);
			const path = Math.random() < 0.5 ? `/api/v1/games/${s.gameId}/cards/${card.id}/face.svg` : pick(['/api/v1/me', `/games/${s.gameId}`, `/api/v1/games/${s.gameId}/cards`]);
			const tag = etags.get(path);
			const res = await fetch(server.url + path, { headers: { ...s.headers, ...(tag && Math.random() < 0.7 ? { 'if-none-match': tag } : {}) } });
			await res.arrayBuffer();
			if (res.headers.get('etag')) etags.set(path, res.headers.get('etag')!);
			requests++;
			if (res.status >= 500) errors++;
		}
	};
	let edits = 0;
	const editor = async () => {
		while (Date.now() < end) {
			await sleep(5000);
			const card = pick(s.cards);
			const res = await fetch(`${server.url}/api/v1/games/${s.gameId}/cards/${card.id}`, {
				method: 'PUT',
				headers: { ...s.headers, 'content-type': 'application/json' },
				body: JSON.stringify({ ...card, name: `${card.name.replace(/ \(\d+\)$/, '')} (${++edits})` })
			});
			const saved = (await res.json()) as { card?: { version: number; name: string } };
			if (saved.card) Object.assign(card, { version: saved.card.version, name: saved.card.name });
			else errors++;
		}
	};
	let builds = 0;
	const printer = async () => {
		let n = 0;
		while (Date.now() < end) {
			await sleep(20_000);
			const kind = ++n % 6 === 0 ? 'pngs' : 'sheets';
			const r = await sheetJob(s, server.url, { paper: pick(['a4', 'letter']), duplex: 'long', sets: String(1 + (n % 3)) }, kind);
			builds++;
			if (r.status >= 500 && r.status !== 503) errors++;
		}
	};
	await Promise.all([...Array.from({ length: clients }, reader), editor(), printer()]);
	return { requests, edits, builds, errors };
}
