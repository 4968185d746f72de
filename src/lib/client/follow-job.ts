/**
 * Following a print job from the browser: its event stream (GET /api/v1/print-jobs/{id}/events)
 * while it runs, one request for the whole build; polling its state where the stream cannot be
 * had, which also brings the server's own words when the job is not the caller's or is gone.
 */
import type { z } from 'zod';
import { apiFetch } from './api';
import type { PrintJobSchema } from '$lib/schemas/api';

export type JobState = z.output<typeof PrintJobSchema>;

const POLL_MS = 300;
const running = (j: JobState) => j.state === 'queued' || j.state === 'running';

/** The stream's states until the job ends; null when the stream failed for good (the browser gave up on it). */
function streamed(id: string, set: (j: JobState) => void): Promise<JobState | null> {
	if (typeof EventSource === 'undefined') return Promise.resolve(null);
	return new Promise((resolve) => {
		const source = new EventSource(`/api/v1/print-jobs/${id}/events`);
		source.addEventListener('state', (e) => {
			const j = JSON.parse((e as MessageEvent<string>).data) as JobState;
			set(j);
			if (!running(j)) {
				source.close();
				resolve(j);
			}
		});
		// A stream that ended unfinished is opened again by the browser itself; a refused one is closed.
		source.addEventListener('error', () => {
			if (source.readyState === EventSource.CLOSED) resolve(null);
		});
	});
}

/** Follows job `j` to its end, passing each state to `set`; returns the last. */
export async function followJob(j: JobState, set: (j: JobState) => void): Promise<JobState> {
	if (!running(j)) return j;
	const last = await streamed(j.id, set);
	if (last) return last;
	for (;;) {
		j = await apiFetch<JobState>(`/api/v1/print-jobs/${j.id}`);
		set(j);
		if (!running(j)) return j;
		await new Promise((r) => setTimeout(r, POLL_MS));
	}
}
