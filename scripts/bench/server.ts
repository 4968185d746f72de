/**
 * The app as a whole process under HTTP load: the built server (`npm run build`) started on a
 * scratch data directory with the demo, signed in as the demo designer. Shared by the bench's
 * server section and the soak (scripts/soak.ts).
 */
import { fork, spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import autocannon from 'autocannon';
import { EventSourceParserStream } from 'eventsource-parser/stream';
import { appEnv } from '../app-env.js';

const ROOT = new URL('../..', import.meta.url).pathname;

export interface CacheStats {
	entries: number;
	bytes: number;
	maxBytes: number;
}

export interface Vitals {
	rssMb: number;
	/** The main thread's V8 heap, used and reserved. */
	heapMb: number;
	heapTotalMb: number;
	/** Memory outside the heap held by JavaScript objects; of it, ArrayBuffers (Buffers, typed arrays). */
	externalMb: number;
	arrayBuffersMb: number;
	loopDelayMs: { p50: number; p99: number; max: number };
	/** The main thread's collections since the last report: full and young, each with its longest pause. */
	gc: { full: number; fullMaxMs: number; young: number; youngMaxMs: number };
	faceCache: CacheStats & { keys?: CacheStats };
	/** Game documents read lately, and art files read lately (src/lib/server/game-store.ts, art-files.ts). */
	gameCache?: CacheStats;
	artCache?: CacheStats;
	printWorkersWarm: boolean;
	/** Print worker threads started now, kept while idle, and at most. */
	printWorkers: number;
	printWorkersIdle: number;
	printWorkersMax: number;
	/** Each print worker's cache budget. */
	printCacheMaxBytes: number;
}

/** A thread's time since it started: ms it ran, and ms it was ready to run but waited for a core (Linux's per-thread schedstat). */
export interface ThreadTimes {
	runMs: number;
	waitMs: number;
}

export interface Server {
	url: string;
	pid: number;
	/** Whole-process RSS (every thread), from /proc. */
	rssMb(): number;
	/** The server's own figures (SIGUSR2, see src/lib/server/vitals.ts); resets its loop-delay histogram. */
	vitals(): Promise<Vitals>;
	/** The server's own thread since it started (undefined where the kernel keeps no schedstat). */
	threadTimes(): ThreadTimes | undefined;
	stop(): Promise<void>;
}

/**
 * `buildDir`: a copy of build/ to run (a long soak keeps running while build/ is rebuilt); also
 * BENCH_BUILD_DIR, e.g. to compare two builds.
 */
export async function startServer(port: number, buildDir = process.env.BENCH_BUILD_DIR ?? 'build'): Promise<Server> {
	if (buildDir === 'build') {
		const { buildAppIfStale } = await import('../build-if-stale.js');
		await buildAppIfStale();
	}
	const dataDir = mkdtempSync(join(tmpdir(), 'paddock-bench-data-'));
	const url = `http://localhost:${port}`;
	// BENCH_SERVER_ARGS: node options for the server, e.g. `--cpu-prof` to see where its time goes.
	const nodeArgs = (process.env.BENCH_SERVER_ARGS ?? '').split(' ').filter(Boolean);
	const child: ChildProcess = spawn(process.execPath, [...nodeArgs, join(buildDir, 'index.js')], {
		cwd: ROOT,
		// The body limit `npm start` sets (scripts/start.js); the framework's own default refuses art uploads.
		env: { ...appEnv(), PORT: String(port), ORIGIN: url, PADDOCK_DATA_DIR: dataDir, PADDOCK_DEMO: '1', DATABASE_URL: '', BODY_SIZE_LIMIT: process.env.BODY_SIZE_LIMIT ?? '210M' },
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
		threadTimes: () => {
			try {
				// Fields: ns on a core, ns waiting on a run queue, time slices (the kernel's sched-stats documentation).
				const [run, wait] = readFileSync(`/proc/${child.pid}/task/${child.pid}/schedstat`, 'utf8').trim().split(' ').map(Number);
				return { runMs: run / 1e6, waitMs: wait / 1e6 };
			} catch {
				return undefined;
			}
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

/** Margins for successive sheet builds: each request differs, so each is built, not answered from a finished twin. */
let margins = 0;
export const freshMargin = () => (4 + (margins++ % 4000) / 1000).toFixed(3);

/**
 * A sheet build through the print page's job route, followed to the end; ms from start to file.
 * Followed as the print page follows it, by the job's event stream, or by a poll every `follow` ms
 * as an API client might. Sheet builds get a margin of their own unless the query names one.
 */
export async function sheetJob(s: Session, url: string, query: Record<string, string>, kind: 'sheets' | 'pngs' = 'sheets', follow: 'events' | number = 'events') {
	if (kind === 'sheets' && !query.margin) query = { ...query, margin: freshMargin() };
	const t = performance.now();
	const res = await fetch(`${url}/api/v1/games/${s.gameId}/print-jobs`, {
		method: 'POST',
		headers: { ...s.headers, 'content-type': 'application/json' },
		body: JSON.stringify({ kind, query })
	});
	if (res.status !== 202) return { status: res.status, retryAfter: res.headers.get('retry-after'), ms: performance.now() - t };
	const job = (await res.json()) as { id: string };
	const state = follow === 'events' ? await streamedEnd(s, url, job.id) : await polledEnd(s, url, job.id, follow);
	const file = await fetch(`${url}/api/v1/print-jobs/${job.id}/file`, { headers: s.headers });
	const bytes = (await file.arrayBuffer()).byteLength;
	return { status: file.status, ms: performance.now() - t, bytes, state };
}

const ended = (state: string) => state === 'done' || state === 'failed';

/** The job's last state, read from its event stream (opened again should it end unfinished). */
async function streamedEnd(s: Session, url: string, id: string): Promise<string> {
	for (;;) {
		const res = await fetch(`${url}/api/v1/print-jobs/${id}/events`, { headers: s.headers });
		if (!res.ok || !res.body) throw new Error(`the job's events answered ${res.status}`);
		const events = res.body.pipeThrough(new TextDecoderStream()).pipeThrough(new EventSourceParserStream());
		for await (const event of events) {
			const { state } = JSON.parse(event.data) as { state: string };
			if (ended(state)) return state;
		}
	}
}

async function polledEnd(s: Session, url: string, id: string, pollMs: number): Promise<string> {
	for (;;) {
		const { state } = (await (await fetch(`${url}/api/v1/print-jobs/${id}`, { headers: s.headers })).json()) as { state: string };
		if (ended(state)) return state;
		await sleep(pollMs);
	}
}

/**
 * The mixed load of a working day, for `ms`: `clients` people reading faces and pages, one of
 * them editing a card now and then (new faces for the caches), a sheet build every ~20 s and a
 * PNG zip every ~2 min.
 */
/** A card from the list as the save takes it: without the fields the list adds for reading. */
function withoutListFields(card: Session['cards'][number]) {
	const { kind: _kind, kindName: _name, ...own } = card as typeof card & { kind?: string; kindName?: string };
	return own;
}

export async function mixedLoad(server: Server, s: Session, ms: number, clients = 4) {
	const end = Date.now() + ms;
	const etags = new Map<string, string>();
	let requests = 0;
	let errors = 0;
	const pick = <T>(xs: T[]) => xs[Math.floor(Math.random() * xs.length)];
	// A request that fails outright (a reset connection) counts as an error; the client carries on.
	const lost = new Map<string, number>();
	const survive = async (step: () => Promise<void>) => {
		try {
			await step();
		} catch (e) {
			errors++;
			const why = String((e as Error & { cause?: Error }).cause?.message ?? (e as Error).message);
			lost.set(why, (lost.get(why) ?? 0) + 1);
			await sleep(1000);
		}
	};
	const reader = async () => {
		while (Date.now() < end) await survive(async () => {
			const card = pick(s.cards);
			const path = Math.random() < 0.5 ? `/api/v1/games/${s.gameId}/cards/${card.id}/face.svg` : pick(['/api/v1/me', `/games/${s.gameId}`, `/api/v1/games/${s.gameId}/cards`]);
			const tag = etags.get(path);
			const res = await fetch(server.url + path, { headers: { ...s.headers, ...(tag && Math.random() < 0.7 ? { 'if-none-match': tag } : {}) } });
			await res.arrayBuffer();
			if (res.headers.get('etag')) etags.set(path, res.headers.get('etag')!);
			requests++;
			if (res.status >= 500) errors++;
		});
	};
	let edits = 0;
	const editor = async () => {
		while (Date.now() < end) await survive(async () => {
			await sleep(5000);
			const card = pick(s.cards);
			const res = await fetch(`${server.url}/api/v1/games/${s.gameId}/cards/${card.id}`, {
				method: 'PUT',
				headers: { ...s.headers, 'content-type': 'application/json' },
				// The list adds the kind's type and name for reading; a save sends the card's own fields only.
				body: JSON.stringify({ ...withoutListFields(card), name: `${card.name.replace(/ \(\d+\)$/, '')} (${++edits})` })
			});
			const saved = (await res.json()) as { card?: { version: number; name: string } };
			if (saved.card) Object.assign(card, { version: saved.card.version, name: saved.card.name });
			else errors++;
		});
	};
	let builds = 0;
	const printer = async () => {
		let n = 0;
		while (Date.now() < end) await survive(async () => {
			await sleep(20_000);
			const kind = ++n % 6 === 0 ? 'pngs' : 'sheets';
			const r = await sheetJob(s, server.url, { paper: pick(['a4', 'letter']), duplex: 'long', sets: String(1 + (n % 3)) }, kind);
			builds++;
			if (r.status >= 500 && r.status !== 503) errors++;
		});
	};
	await Promise.all([...Array.from({ length: clients }, reader), editor(), printer()]);
	return { requests, edits, builds, errors, failures: Object.fromEntries(lost) };
}

/* ------------------------------------------------------------ the section */

const p99 = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(xs.length * 0.99))];
const r1 = (v: number) => Math.round(v * 10) / 10;
const load1 = () => r1(loadavg()[0]);

/** One target line: figure, target, met or not, and the load it was measured under. */
function verdict(what: string, figure: string, target: string, met: boolean) {
	console.log(`  ${what}: ${figure} (target ${target}) — ${met ? 'met' : 'NOT met'}  [load ${load1()}]`);
	return { what, figure, target, met, load: load1() };
}

async function waitWarm(server: Server) {
	for (let i = 0; i < 600 && !(await server.vitals()).printWorkersWarm; i++) await sleep(500);
}

/**
 * /api/v1/me timed from a process of its own (./me-sampler.ts): one request at a time, every
 * `gapMs`, from when `sample` is called until `until` settles. The bench's own process follows the
 * builds and reads their files meanwhile, and a latency timed there would also hold however long
 * its own event loop took to get to the answer; a person's browser asks from another machine.
 */
function meSampler(url: string, headers: Record<string, string>, gapMs = 20) {
	// The bench's own execArgv (its TypeScript loader) is passed on.
	const child = fork(new URL('./me-sampler.ts', import.meta.url).pathname, [], { stdio: ['ignore', 'inherit', 'inherit', 'ipc'] });
	let stopped: (e: Error) => void = () => {};
	child.on('exit', (code) => stopped(new Error(`the /me sampler stopped (exit code ${code})`)));
	const sample = async (until: Promise<unknown>): Promise<number[]> => {
		const answer = new Promise<number[]>((ok, fail) => {
			stopped = fail;
			child.once('message', (m: { ms: number[] }) => ok(m.ms));
		});
		child.send({ start: { url, headers, gapMs } });
		try {
			await until;
		} finally {
			child.send({ stop: true });
		}
		return answer;
	};
	return { sample, close: () => child.kill() };
}

const SHEETS = { paper: 'a4', duplex: 'long' };
/** How often a client polling a build asks after it (the print page's own fallback, src/lib/client/follow-job.ts). */
const PAGE_POLL_MS = 300;
/** Bursts of 8 builds /me is sampled through, in each of ME_ROUNDS rounds. */
const BUSY_BURSTS = 24;
const ME_ROUNDS = 3;
/** How long /me is sampled idle: about as many samples as the bursts give. */
const IDLE_SAMPLE_MS = 30_000;

/**
 * The server section of `npm run bench`: the built app as a whole process. Each start measures
 * idle RSS (workers warm) and the first sheet against warm ones; the last start then measures
 * faces against /api/v1/me, /me during 8 builds, the busy answer, the PNG zip twice and RSS
 * after the burst.
 */
export async function benchServer(options: { port?: number; starts?: number } = {}) {
	const port = options.port ?? Number(process.env.BENCH_PORT ?? 4431);
	const starts = Math.max(1, options.starts ?? 3);
	console.log(`\nServer (the built app as a whole process, ${starts} starts, load ${load1()} at the start):`);
	const results: ReturnType<typeof verdict>[] = [];
	const idleRss: number[] = [];
	const firstOverWarm: number[] = [];
	const firstMs: number[] = [];
	const warmMs: number[] = [];
	let server: Server | undefined;
	let closeSampler = () => {};
	try {
		for (let i = 0; i < starts; i++) {
			server = await startServer(port);
			await waitWarm(server);
			await sleep(3000);
			idleRss.push(server.rssMb());
			const s = await signIn(server.url);
			const first = await sheetJob(s, server.url, SHEETS);
			const warm: number[] = [];
			for (let k = 0; k < 3; k++) warm.push((await sheetJob(s, server.url, SHEETS)).ms);
			firstMs.push(first.ms);
			warmMs.push(median(warm));
			firstOverWarm.push(first.ms / median(warm));
			if (i < starts - 1) {
				await server.stop();
				server = undefined;
			}
		}
		console.log(`  idle RSS per start: ${idleRss.join(', ')} MB; first sheet ${firstMs.map((x) => x.toFixed(0)).join(', ')} ms, warm (median of 3) ${warmMs.map((x) => x.toFixed(0)).join(', ')} ms`);
		results.push(verdict('idle RSS, workers warm (median of starts)', `${median(idleRss)} MB`, '< 450 MB', median(idleRss) < 450));
		results.push(verdict('first sheet after start ÷ warm sheet (median of starts)', `${r1(median(firstOverWarm))}×`, '≤ 3×', median(firstOverWarm) <= 3));

		const srv = server!;
		const s = await signIn(srv.url);
		const me = `${srv.url}/api/v1/me`;
		const face = `${srv.url}/api/v1/games/${s.gameId}/cards/${s.cards[0].id}/face.svg`;
		await timeRequest(face, { headers: s.headers });
		// A repeat face against /me, one after the other, alternated.
		const meMs: number[] = [];
		const faceMs: number[] = [];
		for (let i = 0; i < 40; i++) {
			meMs.push((await timeRequest(me, { headers: s.headers })).ms);
			faceMs.push((await timeRequest(face, { headers: s.headers })).ms);
		}
		results.push(
			verdict(
				'repeat face.svg ÷ /api/v1/me (medians of 40 alternated)',
				`${r1(median(faceMs) / median(meMs))}× (${r1(median(faceMs))} vs ${r1(median(meMs))} ms)`,
				'≤ 2×',
				median(faceMs) <= 2 * median(meMs)
			)
		);
		// p99 at 10 connections, three alternated rounds each.
		const meP99: number[] = [];
		const faceP99: number[] = [];
		for (let i = 0; i < 3; i++) {
			meP99.push((await loadTest(me, s.headers, 10, 5)).p99);
			faceP99.push((await loadTest(face, s.headers, 10, 5)).p99);
		}
		results.push(
			verdict(
				'face.svg p99 ÷ /me p99 at 10 connections (medians of 3 rounds)',
				`${r1(median(faceP99) / median(meP99))}× (${median(faceP99)} vs ${median(meP99)} ms)`,
				'≤ 3×',
				median(faceP99) <= 3 * median(meP99)
			)
		);

		// /me while 8 sheet builds run, against /me idle; the event loop's delay meanwhile. A p99 of
		// a few hundred samples is the third or fourth slowest, and one stall of the machine's moves
		// it: idle is sampled for 30 s (some 1,100), busy over BUSY_BURSTS bursts of 8 builds (some
		// 30 each), so both p99s are about the same rank and rest on ten or so samples each. Even so
		// the ratio went from 1.5× to 2.1× in five runs of the same build on two cores: it is taken in
		// ME_ROUNDS rounds and the median is the figure, as for the faces' p99s above. Every round is printed.
		const sampler = meSampler(me, s.headers);
		closeSampler = sampler.close;
		// Its first requests open the connection and compile its code: not counted.
		await sampler.sample(sleep(2_000));
		const eightBuilds = (follow: 'events' | number) =>
			Promise.all(Array.from({ length: 8 }, (_, i) => sheetJob(s, srv.url, { ...SHEETS, sets: String(1 + (i % 3)) }, 'sheets', follow)));
		const meRound = async () => {
			// The bench's own event loop meanwhile: what /me would have gained, timed from here.
			const ownLoop = monitorEventLoopDelay({ resolution: 1 });
			ownLoop.enable();
			await srv.vitals();
			const atIdle = srv.threadTimes();
			const idle = await sampler.sample(sleep(IDLE_SAMPLE_MS));
			const { loopDelayMs: idleLoop, gc: idleGc } = await srv.vitals();
			const ownIdleP99 = ownLoop.percentile(99) / 1e6;
			ownLoop.reset();
			const atBusy = srv.threadTimes();
			const busy: number[] = [];
			const burstMax: number[] = [];
			for (let burst = 0; burst < BUSY_BURSTS; burst++) {
				// Each build followed as the print page follows it (its event stream).
				const ms = await sampler.sample(eightBuilds('events'));
				busy.push(...ms);
				burstMax.push(Math.max(...ms));
			}
			const { loopDelayMs: busyLoop, gc: busyGc } = await srv.vitals();
			const ownBusyP99 = ownLoop.percentile(99) / 1e6;
			ownLoop.disable();
			return { idle, busy, burstMax, idleLoop, busyLoop, idleGc, busyGc, ownIdleP99, ownBusyP99, atIdle, atBusy, afterBusy: srv.threadTimes(), ratio: p99(busy) / p99(idle) };
		};
		const rounds: Awaited<ReturnType<typeof meRound>>[] = [];
		for (let i = 0; i < ME_ROUNDS; i++) rounds.push(await meRound());
		const mid = [...rounds].sort((a, b) => a.ratio - b.ratio)[Math.floor(rounds.length / 2)];
		const { idle } = mid;
		results.push(
			verdict(
				`/me p99 during 8 sheet builds ÷ idle (median of ${ME_ROUNDS} rounds of ${BUSY_BURSTS} bursts)`,
				`${r1(mid.ratio)}× (rounds ${rounds.map((r) => `${r1(r.ratio)}× (${r1(p99(r.busy))} vs ${r1(p99(r.idle))} ms)`).join(', ')}; median round: ${mid.busy.length} vs ${idle.length} samples, slowest per burst ${mid.burstMax.map(r1).join(', ')} ms, event-loop delay p99 ${mid.busyLoop.p99} vs ${mid.idleLoop.p99} ms)`,
				'≤ 2×',
				mid.ratio <= 2
			)
		);
		// How much of the time the server's thread was ready to run it spent waiting for a core (the
		// builds' worker threads, the bench's own clients and other programs take them meanwhile).
		const waited = (from?: ThreadTimes, to?: ThreadTimes) => {
			if (!from || !to) return 'not known here';
			const run = to.runMs - from.runMs;
			const wait = to.waitMs - from.waitMs;
			return `ran ${Math.round(run)} ms, waited for a core ${Math.round(wait)} ms (${Math.round((100 * wait) / (run + wait))}% of its ready time)`;
		};
		console.log(`  the server's thread in the median round, while idle: ${waited(mid.atIdle, mid.atBusy)}; during the builds: ${waited(mid.atBusy, mid.afterBusy)}`);
		const collected = (gc: Vitals['gc']) => `${gc.full} full (longest ${gc.fullMaxMs} ms), ${gc.young} young (longest ${gc.youngMaxMs} ms)`;
		console.log(`  its garbage collections in the median round, while idle: ${collected(mid.idleGc)}; during the builds: ${collected(mid.busyGc)}`);
		console.log(
			`  /me is timed from a process of its own: this process's event loop, which follows the builds, was delayed p99 ${r1(mid.ownBusyP99)} ms during them against ${r1(mid.ownIdleP99)} ms idle`
		);
		// The same with every build followed by polling its state every PAGE_POLL_MS, as an API client might.
		const polled = await sampler.sample(eightBuilds(PAGE_POLL_MS));
		console.log(`  /me during 8 builds followed by ${PAGE_POLL_MS} ms polls instead (one burst): p99 ${r1(p99(polled))} ms over ${polled.length} samples, ${r1(p99(polled) / p99(idle))}× idle`);
		// Past the queue: refused with 503 and Retry-After.
		const flood = await Promise.all(
			Array.from({ length: 30 }, () =>
				fetch(`${srv.url}/api/v1/games/${s.gameId}/print-jobs`, {
					method: 'POST',
					headers: { ...s.headers, 'content-type': 'application/json' },
					body: JSON.stringify({ kind: 'sheets', query: { ...SHEETS, margin: freshMargin() } })
				})
			)
		);
		const refused = flood.filter((r) => r.status === 503);
		const withRetry = refused.filter((r) => r.headers.get('retry-after'));
		results.push(
			verdict(
				'30 builds at once: refused with 503 + Retry-After',
				`${refused.length} refused, ${withRetry.length} with Retry-After`,
				'some refused past the queue, each with Retry-After',
				refused.length > 0 && withRetry.length === refused.length
			)
		);
		// Let the flood's accepted builds finish before the zip.
		const accepted = await Promise.all(flood.filter((r) => r.status === 202).map(async (r) => ((await r.json()) as { id: string }).id));
		for (const id of accepted) {
			for (let i = 0; i < 1200; i++) {
				const state = (await (await fetch(`${srv.url}/api/v1/print-jobs/${id}`, { headers: s.headers })).json()) as { state: string };
				if (state.state === 'done' || state.state === 'failed') break;
				await sleep(250);
			}
		}
		const zip1 = await sheetJob(s, srv.url, { dpi: '300' }, 'pngs');
		const zip2 = await sheetJob(s, srv.url, { dpi: '300' }, 'pngs');
		results.push(
			verdict('second PNG zip ÷ first', `${r1(zip2.ms / zip1.ms)} (${zip1.ms.toFixed(0)} → ${zip2.ms.toFixed(0)} ms)`, '≤ 0.25 (instant: our threshold)', zip2.ms <= 0.25 * zip1.ms)
		);
		const peak = srv.rssMb();
		// Extra workers stop after a quiet minute; then the heap settles.
		await sleep(70_000);
		const after = srv.rssMb();
		results.push(verdict('RSS after the burst (70 s later)', `${after} MB (peak seen ${peak} MB)`, '< 450 MB', after < 450));
		console.log('  instant in-browser preview, keystroke to new face: measured by its own section (scripts/bench/preview.ts)');
		console.log('  queries per game-tab page load and per save: counted by tests/integration/request-queries.test.ts, not timed here');
		console.log('  30-minute soak: `npx tsx scripts/soak.ts --minutes 30` (RSS every 10 s; start, peak, end)');
		return { idleRssMb: idleRss, firstSheetMs: firstMs, warmSheetMs: warmMs, meMs: median(meMs), faceMs: median(faceMs), meP99, faceP99, idleP99: p99(idle), busyP99: p99(mid.busy), busyRounds: rounds.map((r) => ({ idleP99: p99(r.idle), busyP99: p99(r.busy) })), busyLoop: mid.busyLoop, idleLoop: mid.idleLoop, zipMs: [zip1.ms, zip2.ms], rssAfterBurstMb: after, targets: results };
	} finally {
		closeSampler();
		await server?.stop();
	}
}
