import { loadTest, signIn, sheetJob, sleep, startServer, timeRequest } from './server';
const p99 = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(xs.length * 0.99))];
const p50 = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length * 0.5)];
const slow: string[] = [];
async function probe(url: string, headers: Record<string, string>, until: Promise<unknown>, gapMs = 20) {
	let done = false;
	void until.finally(() => (done = true));
	const ms: number[] = [];
	const t0 = performance.now();
	while (!done) { const st = performance.now() - t0; const r = (await timeRequest(url, { headers })).ms; ms.push(r); if (r > 60) slow.push(`${r.toFixed(0)}@${st.toFixed(0)}`); await sleep(gapMs); }
	return ms;
}
const srv = await startServer(Number(process.env.PORT ?? 42400));
try {
	for (let i = 0; i < 240 && !(await srv.vitals()).printWorkersWarm; i++) await sleep(500);
	if (process.env.RENICE) {
		const { readdirSync } = await import('node:fs');
		const { setPriority } = await import('node:os');
		const tids = readdirSync(`/proc/${srv.pid}/task`).map(Number).sort((a, b) => a - b);
		for (const t of tids.slice(2, 6)) setPriority(t, Number(process.env.RENICE));
		console.log('reniced', tids.slice(2, 6).join(','));
	}
	const s = await signIn(srv.url);
	const me = `${srv.url}/api/v1/me`;
	await sheetJob(s, srv.url, { paper: 'a4', duplex: 'long' });
	if (process.env.MEONLY) {
		await loadTest(me, s.headers, 10, 3);
		const r = await loadTest(me, s.headers, 10, 8);
		console.log(`MEONLY p50 ${r.p50} p99 ${r.p99} n=${r.requests}`);
	}
	if (process.env.AC) {
		for (let round = 0; round < 3; round++) {
			const idle = await loadTest(me, s.headers, 10, 4);
			const builds = Promise.all(Array.from({ length: 8 }, (_, i) => sheetJob(s, srv.url, { paper: 'a4', duplex: 'long', sets: String(1 + (i % 3)) }, 'sheets', 300)));
			const busy = await loadTest(me, s.headers, 10, 4);
			await builds;
			console.log(`AC round ${round}: idle p50 ${idle.p50} p99 ${idle.p99} n=${idle.requests}; busy p50 ${busy.p50} p99 ${busy.p99} n=${busy.requests}; ratio ${(busy.p99 / idle.p99).toFixed(2)}`);
		}
	}
	for (let round = 0; round < Number(process.env.ROUNDS ?? 2); round++) {
		await srv.vitals();
		const idle = await probe(me, s.headers, sleep(Number(process.env.IDLE ?? 5000)));
		const idleLoop = (await srv.vitals()).loopDelayMs;
		const t = performance.now();
		const builds = Promise.all(Array.from({ length: 8 }, (_, i) => sheetJob(s, srv.url, { paper: 'a4', duplex: 'long', sets: String(1 + (i % 3)) }, 'sheets', Number(process.env.POLL ?? 50))));
		const busy = await probe(me, s.headers, builds);
		const busyLoop = (await srv.vitals()).loopDelayMs;
		console.log(`round ${round}: idle p50 ${p50(idle).toFixed(1)} p99 ${p99(idle).toFixed(1)} (n=${idle.length}); busy p50 ${p50(busy).toFixed(1)} p99 ${p99(busy).toFixed(1)} (n=${busy.length}) ratio ${(p99(busy) / p99(idle)).toFixed(2)}; loop idle ${JSON.stringify(idleLoop)} busy ${JSON.stringify(busyLoop)}; builds ${(performance.now() - t).toFixed(0)} ms`);
		console.log('  slow', slow.splice(0).join(' '));
		console.log('  busy sorted tail', [...busy].sort((a, b) => b - a).slice(0, 8).map((x) => x.toFixed(0)).join(' '));
	}
} finally { await srv.stop(); }
