/**
 * `npx tsx scripts/soak.ts [--minutes 30] [--port 4430] [--build-dir build] [--quiet-seconds 90]`:
 * the server under the benchmark's mixed HTTP load (scripts/bench/server.ts) for a long while,
 * its RSS sampled every 10 s, then through a quiet spell after the load (after a quiet minute the
 * extra print workers stop and a worker that drew PNGs is replaced). Prints RSS at the start, its
 * peak, at the end of the load and after the quiet spell; whether "after" is under the target; and
 * whether the growth stayed within the caches' byte bounds. Every sample goes to soak-results.json.
 */
import { writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { parseArgs } from 'node:util';
import { mixedLoad, signIn, sleep, startServer, type Vitals } from './bench/server';

const TARGET_MB = 450;
const MB = 2 ** 20;

const { values } = parseArgs({
	options: { minutes: { type: 'string' }, port: { type: 'string' }, 'build-dir': { type: 'string' }, 'quiet-seconds': { type: 'string' } }
});
const minutes = Number(values.minutes ?? 30);
const quietSeconds = Number(values['quiet-seconds'] ?? 90);
const server = await startServer(Number(values.port ?? 4430), values['build-dir']);

interface Sample {
	s: number;
	phase: 'start' | 'load' | 'quiet';
	rssMb: number;
	heapMb: number;
	externalMb: number;
	arrayBuffersMb: number;
	faceCacheMb: number;
	printWorkers: number;
	loopP99Ms: number;
	load: number;
}

try {
	const session = await signIn(server.url);
	let vitals: Vitals = await server.vitals();
	for (let i = 0; i < 240 && !vitals.printWorkersWarm; i++) {
		await sleep(500);
		vitals = await server.vitals();
	}
	const samples: Sample[] = [];
	const t0 = Date.now();
	const sample = async (phase: Sample['phase']) => {
		const v = (vitals = await server.vitals());
		const x: Sample = {
			s: Math.round((Date.now() - t0) / 1000),
			phase,
			rssMb: server.rssMb(),
			heapMb: v.heapMb,
			externalMb: v.externalMb,
			arrayBuffersMb: v.arrayBuffersMb,
			faceCacheMb: Math.round(v.faceCache.bytes / MB),
			printWorkers: v.printWorkers,
			loopP99Ms: v.loopDelayMs.p99,
			load: Math.round(loadavg()[0] * 10) / 10
		};
		samples.push(x);
		console.log(
			`${String(x.s).padStart(5)} s ${phase.padEnd(5)}  RSS ${x.rssMb} MB  heap ${x.heapMb} MB  external ${x.externalMb} MB (buffers ${x.arrayBuffersMb})  face cache ${x.faceCacheMb} MB  print workers ${x.printWorkers}  loop p99 ${x.loopP99Ms} ms  load ${x.load}`
		);
		return x;
	};
	const start = await sample('start');
	const timer = setInterval(() => void sample('load'), 10_000);
	const load = await mixedLoad(server, session, minutes * 60_000);
	clearInterval(timer);
	const endOfLoad = await sample('load');
	// The quiet spell: every 10 s for `quietSeconds`, and on until the extra workers have stopped.
	const quietUntil = Date.now() + quietSeconds * 1000;
	let after = endOfLoad;
	while (Date.now() < quietUntil || (vitals.printWorkers > vitals.printWorkersIdle && Date.now() < quietUntil + 120_000)) {
		await sleep(10_000);
		after = await sample('quiet');
	}

	const peakMb = Math.max(...samples.map((x) => x.rssMb));
	const loads = samples.map((x) => x.load);
	// What the caches may hold once the load is over: the server's own (faces and their keys, game
	// documents, art files) and each print worker still started.
	const bounds = {
		faceCacheMb: vitals.faceCache.maxBytes / MB,
		faceKeysMb: (vitals.faceCache.keys?.maxBytes ?? 0) / MB,
		gameCacheMb: (vitals.gameCache?.maxBytes ?? 0) / MB,
		artCacheMb: (vitals.artCache?.maxBytes ?? 0) / MB,
		printCachesMb: (vitals.printWorkersIdle * vitals.printCacheMaxBytes) / MB
	};
	const boundsMb = Object.values(bounds).reduce((a, b) => a + b, 0);
	// And what the server's own caches hold at the end (the print workers' are not reported).
	const heldMb = (c?: { bytes: number }) => Math.round(((c?.bytes ?? 0) / MB) * 10) / 10;
	const held = { faceCacheMb: heldMb(vitals.faceCache), faceKeysMb: heldMb(vitals.faceCache.keys), gameCacheMb: heldMb(vitals.gameCache), artCacheMb: heldMb(vitals.artCache) };
	const growthMb = after.rssMb - start.rssMb;
	const summary = {
		minutes,
		startMb: start.rssMb,
		peakMb,
		endOfLoadMb: endOfLoad.rssMb,
		afterQuietMb: after.rssMb,
		quietSeconds: after.s - endOfLoad.s,
		afterUnderTarget: after.rssMb < TARGET_MB,
		growthMb,
		cacheBoundsMb: { ...bounds, sum: boundsMb },
		cachesHeldMb: held,
		growthWithinBounds: growthMb <= boundsMb,
		loadAverage: { min: Math.min(...loads), max: Math.max(...loads), mean: Math.round((loads.reduce((a, b) => a + b, 0) / loads.length) * 10) / 10 },
		load,
		samples
	};
	writeFileSync('soak-results.json', JSON.stringify(summary, null, '\t') + '\n');
	console.log(
		`Soak ${minutes} min: RSS start ${start.rssMb} MB, peak ${peakMb} MB, end of load ${endOfLoad.rssMb} MB, after ${summary.quietSeconds} s quiet ${after.rssMb} MB` +
			` (load average ${summary.loadAverage.min}–${summary.loadAverage.max}, mean ${summary.loadAverage.mean}); ${load.requests} requests, ${load.edits} edits, ${load.builds} builds, ${load.errors} errors` +
			(Object.keys(load.failures).length ? ` (failed outright: ${JSON.stringify(load.failures)})` : '')
	);
	console.log(`  after the quiet spell: ${after.rssMb} MB (target < ${TARGET_MB} MB) — ${summary.afterUnderTarget ? 'met' : 'NOT met'}`);
	console.log(
		`  growth start → after: ${growthMb} MB; caches' byte bounds ${boundsMb} MB (face cache ${bounds.faceCacheMb} + its key map ${bounds.faceKeysMb} + game documents ${bounds.gameCacheMb} + art ${bounds.artCacheMb} + ${vitals.printWorkersIdle} print worker × ${vitals.printCacheMaxBytes / MB}) — ${summary.growthWithinBounds ? 'within' : 'BEYOND'}`
	);
	console.log(`  the server's caches hold at the end: faces ${held.faceCacheMb} MB, their keys ${held.faceKeysMb}, game documents ${held.gameCacheMb}, art ${held.artCacheMb}`);
} finally {
	await server.stop();
}
