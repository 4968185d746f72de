/**
 * Hostile uploads against a running server: the built app (`npm run build`) on a scratch data
 * directory, signed in as the demo designer, receives 5 art uploads at once through
 * POST /api/v1/games/{id}/art/upload, and the server's whole-process RSS (every thread, from
 * /proc) is sampled every 10 ms. Meanwhile a reader asks for /api/v1/me every 100 ms: the
 * slowest answer says whether other requests are still served. Target: peak under 1.5 GB.
 *
 * Rounds, each 5 uploads at once:
 *   - compressed: 10000 × 10000 px grey PNG, about 300 KB on the wire (its header claims 100 MP);
 *   - large:      10000 × 10000 px with a band of random pixels, about 20 MB on the wire;
 *   - claims only: a PNG header claiming 30000 × 30000 px with no pixel data (refused unread).
 *
 * Run alone with `npx tsx scripts/bench/upload-memory.ts` (BENCH_PORT sets the port block).
 */
import { crc32 } from 'node:zlib';
import { loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { bigPng } from './art-memory';
import { signIn, sleep, startServer } from './server';

const PORT = Number(process.env.BENCH_PORT ?? process.env.E2E_PORT ?? 4450) + 20;
const UPLOADS = 5;
const TARGET_MB = 1536;

export interface UploadRound {
	round: string;
	widthPx: number;
	heightPx: number;
	fileBytes: number;
	statuses: number[];
	restingRssMb: number;
	peakRssMb: number;
	wallMs: number;
	/** The slowest /api/v1/me answer while the uploads ran, and how many failed. */
	slowestOtherMs: number;
	otherFailures: number;
}

export interface UploadMemoryBench {
	loadAverage: number;
	targetMb: number;
	rounds: UploadRound[];
	peakRssMb: number;
	underTarget: boolean;
}

/** A PNG whose IHDR claims `side` × `side` px RGBA and holds no image data (ISO/IEC 15948 §5.3, §11.2.2). */
function claimOnlyPng(side: number): Uint8Array {
	const chunk = (type: string, data: Buffer) => {
		const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
		const out = Buffer.alloc(12 + data.length);
		out.writeUInt32BE(data.length, 0);
		body.copy(out, 4);
		out.writeUInt32BE(crc32(body) >>> 0, 8 + data.length);
		return out;
	};
	const ihdr = Buffer.alloc(13);
	ihdr.writeUInt32BE(side, 0);
	ihdr.writeUInt32BE(side, 4);
	ihdr.set([8, 6, 0, 0, 0], 8);
	return new Uint8Array(Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IEND', Buffer.alloc(0))]));
}

export async function benchUploadMemory(): Promise<UploadMemoryBench> {
	console.log(`Hostile uploads through a running server (port ${PORT}):`);
	const files = [
		{ round: 'compressed 10000 × 10000', widthPx: 10_000, heightPx: 10_000, bytes: bigPng(10_000, 10_000) },
		{ round: 'large 10000 × 10000', widthPx: 10_000, heightPx: 10_000, bytes: bigPng(10_000, 10_000, 660) },
		{ round: 'claims 30000 × 30000', widthPx: 30_000, heightPx: 30_000, bytes: claimOnlyPng(30_000) }
	];
	const server = await startServer(PORT);
	const rounds: UploadRound[] = [];
	try {
		const s = await signIn(server.url);
		for (const file of files) {
			await sleep(1000);
			const restingRssMb = server.rssMb();
			let peak = restingRssMb;
			const sampler = setInterval(() => {
				try {
					peak = Math.max(peak, server.rssMb());
				} catch {
					/* the process is gone: the uploads below say so */
				}
			}, 10);
			let running = true;
			let slowest = 0;
			let failures = 0;
			const other = (async () => {
				while (running) {
					const t = performance.now();
					try {
						const res = await fetch(`${server.url}/api/v1/me`, { headers: s.headers });
						await res.arrayBuffer();
						if (!res.ok) failures++;
					} catch {
						failures++;
					}
					slowest = Math.max(slowest, performance.now() - t);
					await sleep(100);
				}
			})();
			const started = performance.now();
			const statuses = await Promise.all(
				Array.from({ length: UPLOADS }, async (_, i) => {
					try {
						const res = await fetch(`${server.url}/api/v1/games/${s.gameId}/art/upload?status=sketch`, {
							method: 'POST',
							headers: { ...s.headers, 'content-type': 'image/png', 'x-file-name': `hostile-${i}.png` },
							body: file.bytes
						});
						await res.arrayBuffer();
						return res.status;
					} catch {
						return 0;
					}
				})
			);
			const wallMs = Math.round(performance.now() - started);
			running = false;
			await other;
			clearInterval(sampler);
			peak = Math.max(peak, server.rssMb());
			const r: UploadRound = {
				round: file.round,
				widthPx: file.widthPx,
				heightPx: file.heightPx,
				fileBytes: file.bytes.byteLength,
				statuses,
				restingRssMb,
				peakRssMb: peak,
				wallMs,
				slowestOtherMs: Math.round(slowest),
				otherFailures: failures
			};
			rounds.push(r);
			console.log(
				`  ${r.round} (${Math.round(r.fileBytes / 1024)} KB each) × ${UPLOADS} at once: answers ${statuses.join(' ')}; ` +
					`server RSS ${r.restingRssMb} MB before, peak ${r.peakRssMb} MB; ${r.wallMs} ms; ` +
					`slowest other request ${r.slowestOtherMs} ms${failures ? `, ${failures} failed` : ''}`
			);
		}
	} finally {
		await server.stop();
	}
	const peakRssMb = Math.max(...rounds.map((r) => r.peakRssMb));
	const result = { loadAverage: Math.round(loadavg()[0] * 10) / 10, targetMb: TARGET_MB, rounds, peakRssMb, underTarget: peakRssMb < TARGET_MB };
	console.log(`  peak server RSS ${peakRssMb} MB against the ${TARGET_MB} MB target: ${result.underTarget ? 'met' : 'NOT met'} (load average ${result.loadAverage})`);
	return result;
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
	benchUploadMemory().catch((e) => {
		console.error(e);
		process.exitCode = 1;
	});
}
