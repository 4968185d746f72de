/**
 * One odds worker thread (started by ./parallel.ts): compiles a job once, then plays the chunks
 * of samples it is handed and sends back each chunk's tally (buffers transferred, not copied).
 */
import { parentPort } from 'node:worker_threads';
import type { FromOddsWorker, OddsJob, ToOddsWorker } from './parallel';
import { compileRace, emptyRaceTally, type RaceRunner } from './race';
import { chunkGenerator, chunkSize, compileStage, emptyTally, sampleStage, type CompiledStage } from './stage';
import { lowerThreadPriority } from '../threads/priority';

const port = parentPort;
if (!port) throw new Error('worker.ts runs as a worker thread (see ./parallel.ts)');
// Long simulations yield the CPU to the server's own thread.
lowerThreadPriority();

let compiled: { jobId: number; job: OddsJob; stage?: CompiledStage; race?: RaceRunner } | undefined;

port.on('message', (m: ToOddsWorker) => {
	try {
		if (m.job) {
			compiled = { jobId: m.jobId, job: m.job };
			if (m.job.kind === 'stage') compiled.stage = compileStage(m.job.scenario);
			else compiled.race = compileRace(m.job.setup);
		}
		if (!compiled || compiled.jobId !== m.jobId) throw new Error('odds worker was given a chunk of a job it does not hold');
		const { job } = compiled;
		if (job.kind === 'stage') {
			const c = compiled.stage!;
			const tally = emptyTally(c.track.ranked);
			sampleStage(c, chunkGenerator(job.seed, m.chunk), chunkSize(job.samples, m.chunk), tally);
			const reply: FromOddsWorker = { jobId: m.jobId, chunk: m.chunk, kind: 'stage', tally };
			port.postMessage(reply, [tally.places.buffer as ArrayBuffer, tally.squares.buffer as ArrayBuffer]);
		} else {
			const tally = emptyRaceTally(job.setup);
			compiled.race!.run(chunkGenerator(job.seed, m.chunk), chunkSize(job.races, m.chunk), tally);
			const reply: FromOddsWorker = { jobId: m.jobId, chunk: m.chunk, kind: 'race', tally };
			port.postMessage(reply, [tally.final, tally.finalSquares, tally.stageEnds, tally.stageCounts].map((a) => a.buffer as ArrayBuffer));
		}
	} catch (e) {
		port.postMessage({ jobId: m.jobId, chunk: m.chunk, kind: 'error', message: (e as Error).message ?? String(e) } satisfies FromOddsWorker);
	}
});
