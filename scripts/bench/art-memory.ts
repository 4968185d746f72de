/**
 * Memory of art checks: five uploads at once of a 10000 × 10000 px PNG (about 300 KB on the wire,
 * 400 MB as RGBA) through the same inspection every upload and import runs. Measured in a child
 * process of its own: peak RSS (sampled every 10 ms) above the process's resting RSS, and the
 * longest pause of a 10 ms timer meanwhile (whether other requests would still be answered).
 * Run alone with `npx tsx scripts/bench/art-memory.ts`.
 */
import { spawnSync } from 'node:child_process';
import { randomFillSync } from 'node:crypto';
import { deflateSync, crc32 } from 'node:zlib';
import { fileURLToPath } from 'node:url';

export interface ArtMemoryBench {
	uploads: number;
	widthPx: number;
	heightPx: number;
	pngBytes: number;
	restingRssMb: number;
	peakRssMb: number;
	longestTimerPauseMs: number;
	wallMs: number;
}

/** A grey RGB PNG, written row by row (ISO/IEC 15948 chunk layout); `noiseRows` rows of random pixels make it large on the wire too. */
export function bigPng(width: number, height: number, noiseRows = 0): Uint8Array {
	const raw = Buffer.alloc((1 + width * 3) * height, 0x80);
	for (let y = 0; y < height; y++) raw[y * (1 + width * 3)] = 0;
	for (let y = 0; y < Math.min(noiseRows, height); y++) randomFillSync(raw, y * (1 + width * 3) + 1, width * 3);
	const chunk = (type: string, data: Buffer) => {
		const length = Buffer.alloc(4);
		length.writeUInt32BE(data.length);
		const body = Buffer.concat([Buffer.from(type), data]);
		const crc = Buffer.alloc(4);
		crc.writeUInt32BE(crc32(body) >>> 0);
		return Buffer.concat([length, body, crc]);
	};
	const ihdr = Buffer.alloc(13);
	ihdr.writeUInt32BE(width, 0);
	ihdr.writeUInt32BE(height, 4);
	ihdr[8] = 8;
	ihdr[9] = 2;
	return new Uint8Array(
		Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IDAT', deflateSync(raw, { level: noiseRows ? 1 : 9 })), chunk('IEND', Buffer.alloc(0))])
	);
}

async function child(): Promise<ArtMemoryBench> {
	const { inspectArt } = await import('../../src/lib/art/inspect');
	const width = 10_000;
	const height = 10_000;
	let png: Uint8Array | null = bigPng(width, height);
	const pngBytes = png.byteLength;
	// Warm up (fonts, wasm, Jimp) on a small file, then settle.
	await inspectArt(bigPng(64, 64), 'warm.png');
	global.gc?.();
	await new Promise((r) => setTimeout(r, 200));
	const resting = process.memoryUsage.rss();
	let peak = resting;
	let longest = 0;
	let last = performance.now();
	const timer = setInterval(() => {
		const now = performance.now();
		longest = Math.max(longest, now - last - 10);
		last = now;
		peak = Math.max(peak, process.memoryUsage.rss());
	}, 10);
	const started = performance.now();
	await Promise.all(Array.from({ length: 5 }, (_, i) => inspectArt(png!, `big-${i}.png`)));
	const wallMs = performance.now() - started;
	clearInterval(timer);
	png = null;
	const mb = (b: number) => Math.round(b / 1024 / 1024);
	return { uploads: 5, widthPx: width, heightPx: height, pngBytes, restingRssMb: mb(resting), peakRssMb: mb(peak), longestTimerPauseMs: Math.round(longest), wallMs: Math.round(wallMs) };
}

export async function benchArtMemory(): Promise<ArtMemoryBench> {
	const run = spawnSync('npx', ['tsx', fileURLToPath(import.meta.url), '--child'], { encoding: 'utf8', maxBuffer: 1 << 20 });
	const line = run.stdout.trim().split('\n').pop() ?? '';
	if (run.status !== 0 || !line.startsWith('{')) throw new Error(`art memory bench failed: ${run.stderr.slice(-500)}`);
	const result = JSON.parse(line) as ArtMemoryBench;
	console.log(`art memory: 5 × ${result.widthPx} × ${result.heightPx} px PNG at once: peak RSS ${result.peakRssMb} MB (resting ${result.restingRssMb} MB), longest timer pause ${result.longestTimerPauseMs} ms, ${result.wallMs} ms`);
	return result;
}

if (process.argv.includes('--child')) {
	child().then((r) => console.log(JSON.stringify(r)));
} else if (process.argv[1] === fileURLToPath(import.meta.url)) {
	benchArtMemory();
}
