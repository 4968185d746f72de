import { describe, expect, it } from 'vitest';
import type { RequestEvent } from '@sveltejs/kit';
import { backgroundRequests } from './request-hooks';
import { isBackground } from '../db/turns';

/** What `backgroundRequests` reads of a request: its method and route. */
function event(method: string, routeId: string | null) {
	return { request: new Request('http://localhost/x', { method }), route: { id: routeId } } as unknown as RequestEvent;
}

/** Whether the hook ran the request as background work. */
async function ranAsBackground(method: string, routeId: string | null) {
	let seen: boolean | undefined;
	await backgroundRequests({
		event: event(method, routeId),
		resolve: async () => {
			seen = isBackground();
			return new Response('ok');
		}
	});
	return seen;
}

describe('print jobs are background requests', () => {
	it('starting a print job and following it (its state, events and file) run as background work', async () => {
		expect(await ranAsBackground('POST', '/api/v1/games/[gameId=id]/print-jobs')).toBe(true);
		expect(await ranAsBackground('GET', '/api/v1/print-jobs/[jobId=id]')).toBe(true);
		expect(await ranAsBackground('GET', '/api/v1/print-jobs/[jobId=id]/events')).toBe(true);
		expect(await ranAsBackground('GET', '/api/v1/print-jobs/[jobId=id]/file')).toBe(true);
	});

	it("everything else goes first: a person's own requests and pages, the print page itself", async () => {
		expect(await ranAsBackground('GET', '/api/v1/me')).toBe(false);
		expect(await ranAsBackground('GET', '/(app)/games/[gameId=id]/print')).toBe(false);
		expect(await ranAsBackground('PUT', '/api/v1/games/[gameId=id]/cards/[cardId=id]')).toBe(false);
		expect(await ranAsBackground('GET', '/api/v1/games/[gameId=id]/print-jobs')).toBe(false);
		expect(await ranAsBackground('GET', null)).toBe(false);
	});

	it('background requests that arrive together start one per turn of the event loop', async () => {
		const ran: string[] = [];
		await Promise.all(
			[0, 1, 2].map((i) =>
				backgroundRequests({
					event: event('GET', '/api/v1/print-jobs/[jobId=id]/events'),
					resolve: async () => {
						ran.push(`start ${i}`);
						setImmediate(() => ran.push(`round after ${i}`));
						return new Response('ok');
					}
				})
			)
		);
		await new Promise((ok) => setImmediate(ok));
		expect(ran).toEqual(['start 0', 'round after 0', 'start 1', 'round after 1', 'start 2', 'round after 2']);
	});
});
