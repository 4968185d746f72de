/**
 * A process that does nothing but ask: between a `start` and a `stop` message from its parent
 * (`meSampler` in ./server.ts) it sends GET `url` every `gapMs` ms, one request at a time, and
 * answers with each request's latency in ms.
 */
import { sleep, timeRequest } from './server';

interface Start {
	url: string;
	headers: Record<string, string>;
	gapMs: number;
}

let sampling = false;

process.on('message', async (message: { start?: Start; stop?: true }) => {
	if (message.stop) {
		sampling = false;
		return;
	}
	if (!message.start || sampling) return;
	const { url, headers, gapMs } = message.start;
	sampling = true;
	const ms: number[] = [];
	while (sampling) {
		ms.push((await timeRequest(url, { headers })).ms);
		await sleep(gapMs);
	}
	process.send!({ ms });
});
