/**
 * A print job followed as a stream of server-sent events (`text/event-stream`, the HTML
 * standard's EventSource format): one request for the whole build instead of a poll every few
 * hundred milliseconds, each of which would sign the caller in and read the row again. Every
 * event is `state`, its data the job as `GET /api/v1/print-jobs/{id}` answers it, sent when it
 * changes; the stream ends when the job is done or failed.
 *
 * A change this process makes to the row comes with the row as written (./print-jobs.ts
 * `onJobChange`) and is sent with no read. On a shared queue another process may build the job, so
 * the row is also read again every `CHECK_MS`; otherwise every change is made here, and the row is
 * read again only every `QUIET_CHECK_MS`, for what no build writes (a sweep taking the row away).
 * A stream lasts at most `STREAM_MS`: the browser then connects again, so a session ended
 * meanwhile stops it.
 */
import type { Db } from '../db';
import { jobFor, jobState, onJobChange, type PrintJobRow } from '../print-jobs';
import { jobQueue } from '../job-queue';

export const CHECK_MS = 1_000;
export const QUIET_CHECK_MS = 10_000;
export const STREAM_MS = 60_000;
/** How soon a browser connects again after the stream ends unfinished (the `retry` field). */
const RETRY_MS = 500;

const finished = (row: PrintJobRow) => row.state === 'done' || row.state === 'failed';

interface StreamOptions {
	checkMs?: number;
	streamMs?: number;
}

/** The events of `first`'s job, for `userId` (whose job it is: `first` was read as theirs). */
export function jobEventStream(db: Db, userId: string, first: PrintJobRow, signal: AbortSignal, options: StreamOptions = {}): Response {
	const encoder = new TextEncoder();
	const stops: (() => void)[] = [];
	let open = true;
	const stop = () => {
		open = false;
		for (const s of stops.splice(0)) s();
	};
	const body = new ReadableStream<Uint8Array>({
		start(controller) {
			let last = '';
			const end = () => {
				if (!open) return;
				stop();
				controller.close();
			};
			const send = (row: PrintJobRow) => {
				if (!open) return;
				const data = JSON.stringify(jobState(row));
				if (data !== last) {
					last = data;
					controller.enqueue(encoder.encode(`event: state\ndata: ${data}\n\n`));
				}
				if (finished(row)) end();
			};
			// One read at a time; a row heard of meanwhile is sent after it, so states never go back.
			let reading = false;
			let again = false;
			let heard: PrintJobRow | undefined;
			const check = async (row?: PrintJobRow) => {
				if (row) heard = row;
				if (reading) {
					again = true;
					return;
				}
				reading = true;
				try {
					do {
						again = false;
						const next = heard ?? (await jobFor(db, userId, first.id));
						heard = undefined;
						send(next);
					} while ((again || heard) && open);
				} catch {
					// Gone (swept) or the database out of reach: the browser asks again and is answered.
					end();
				} finally {
					reading = false;
				}
			};
			controller.enqueue(encoder.encode(`retry: ${RETRY_MS}\n\n`));
			send(first);
			if (!open) return;
			stops.push(onJobChange(first.id, (row) => void check(row)));
			const every = setInterval(() => void check(), options.checkMs ?? (jobQueue().shared ? CHECK_MS : QUIET_CHECK_MS));
			const deadline = setTimeout(end, options.streamMs ?? STREAM_MS);
			stops.push(() => clearInterval(every), () => clearTimeout(deadline));
			if (signal.aborted) return end();
			signal.addEventListener('abort', end, { once: true });
			stops.push(() => signal.removeEventListener('abort', end));
		},
		cancel: stop
	});
	return new Response(body, {
		headers: {
			'content-type': 'text/event-stream; charset=utf-8',
			'cache-control': 'no-store',
			// Proxies pass each event on as it comes.
			'x-accel-buffering': 'no'
		}
	});
}
