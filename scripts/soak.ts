/**
 * `npx tsx scripts/soak.ts [--minutes 30] [--port 4430] [--build-dir build]`: the server under the benchmark's mixed
 * HTTP load (scripts/bench/server.ts) for a long while, its RSS sampled every 10 s. Prints start,
 * peak and end, and writes every sample to soak-results.json. Memory must level off at the
 * caches' bounds, not keep growing.
 */
import { writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { parseArgs } from 'node:util';
import { mixedLoad, signIn, sleep, startServer } from './bench/server';

const { values } = parseArgs({ options: { minutes: { type: 'string' }, port: { type: 'string' }, 'build-dir': { type: 'string' } } });
const minutes = Number(values.minutes ?? 30);
const server = await startServer(Number(values.port ?? 4430), values['build-dir']);
try {
	const session = await signIn(server.url);
	for (let i = 0; i < 240 && !(await server.vitals()).printWorkersWarm; i++) await sleep(500);
	const samples: { s: number; rssMb: number; load: number; faceCacheMb?: number; loopP99Ms?: number }[] = [];
	const t0 = Date.now();
	const sample = async () => {
		const v = await server.vitals();
		samples.push({ s: Math.round((Date.now() - t0) / 1000), rssMb: server.rssMb(), load: Math.round(loadavg()[0] * 10) / 10, faceCacheMb: Math.round(v.faceCache.bytes / 2 ** 20), loopP99Ms: v.loopDelayMs.p99 });
		const last = samples.at(-1)!;
		console.log(`${String(last.s).padStart(5)} s  RSS ${last.rssMb} MB  face cache ${last.faceCacheMb} MB  loop p99 ${last.loopP99Ms} ms  load ${last.load}`);
	};
	await sample();
	const timer = setInterval(() => void sample(), 10_000);
	const load = await mixedLoad(server, session, minutes * 60_000);
	clearInterval(timer);
	// After the load: let the last builds finish and the heap settle.
	await sleep(20_000);
	await sample();
	const rss = samples.map((x) => x.rssMb);
	const summary = { minutes, startMb: rss[0], peakMb: Math.max(...rss), endMb: rss.at(-1), load, samples };
	writeFileSync('soak-results.json', JSON.stringify(summary, null, '\t') + '\n');
	console.log(`Soak ${minutes} min: RSS start ${summary.startMb} MB, peak ${summary.peakMb} MB, end ${summary.endMb} MB; ${load.requests} requests, ${load.edits} edits, ${load.builds} builds, ${load.errors} errors`);
} finally {
	await server.stop();
}
