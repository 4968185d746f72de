/**
 * The built server's entry (scripts/server-entry.js) hands requests to the app as soon as they
 * are read. Checked against the Node adapter's own files: its entry template, and the request
 * router bundled with it, which without the change defers every request with `setImmediate`.
 *
 * Its first module lowers the priority of the threads Node starts for V8 (scripts/helper-threads.js).
 * Checked in a Node process of its own, against the kernel's figures: each thread's nice value,
 * field 19 of /proc/<pid>/task/<tid>/stat (proc(5)).
 */
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { handleRequestsAtOnce, lowerHelpersFirst } from '../../scripts/server-entry.js';

const adapterFiles = join(dirname(createRequire(import.meta.url).resolve('@sveltejs/adapter-node/package.json')), 'files');

type Router = { use: (fn: (req: unknown, res: { end: () => void }) => void) => Router; attach: (req: unknown, res: unknown) => void; handler: Router['attach'] };

async function router(seen: string[]): Promise<Router> {
	const { p: polka } = (await import(pathToFileURL(join(adapterFiles, 'chunks/vendor.js')).href)) as { p: () => Router };
	return polka().use((_req, res) => {
		seen.push('handled');
		res.end();
	});
}

const request = () => [{ url: '/api/v1/me', method: 'GET', headers: {} }, { finished: false, end() {} }] as const;

describe("the built server's entry", () => {
	it("applies to the adapter's entry template, once and only once", () => {
		const template = readFileSync(join(adapterFiles, 'index.js'), 'utf8');
		const rewritten = handleRequestsAtOnce(template);
		expect(rewritten).not.toBe(template);
		expect(rewritten.split('server.attach = server.handler;').length).toBe(2);
		expect(handleRequestsAtOnce(rewritten)).toBe(rewritten);
		expect(() => handleRequestsAtOnce('export {};')).toThrow(/no longer mounts the handler/);
	});

	it('loads the helper-thread module before any other, once', () => {
		const template = readFileSync(join(adapterFiles, 'index.js'), 'utf8');
		const rewritten = lowerHelpersFirst(template);
		expect(rewritten.split('\n')[0]).toMatch(/^import '\.\/helper-threads\.js';/);
		expect(lowerHelpersFirst(rewritten)).toBe(rewritten);
	});

	it.skipIf(!existsSync('/proc/self/task'))("lowers V8's threads to the print workers' nice value, and no other thread", () => {
		// In start order: main, Node's debug-signal and delayed-task threads, V8's helpers (3 here),
		// libuv's threads (5 here); then a worker thread started afterwards.
		const script = `
			import { threadsInStartOrder } from ${JSON.stringify(join(process.cwd(), 'scripts/helper-threads.js'))};
			import { readFileSync } from 'node:fs';
			import { Worker } from 'node:worker_threads';
			const nice = (tid) => Number(readFileSync('/proc/self/task/' + tid + '/stat', 'utf8').split(') ')[1].split(' ')[16]);
			const worker = new Worker('setTimeout(() => {}, 2000)', { eval: true });
			await new Promise((ok) => worker.once('online', ok));
			console.log(JSON.stringify(threadsInStartOrder().map(nice)));
			await worker.terminate();`;
		const out = execFileSync(process.execPath, ['--v8-pool-size=3', '--input-type=module', '-e', script], {
			encoding: 'utf8',
			env: { ...process.env, UV_THREADPOOL_SIZE: '5', NODE_OPTIONS: '' }
		});
		expect(JSON.parse(out)).toEqual([0, 10, 10, 10, 10, 10, 0, 0, 0, 0, 0, 0]);
	});

	it('runs a request in the turn it is read, where the router alone waits a turn', async () => {
		const seen: string[] = [];
		const deferred = await router(seen);
		deferred.attach(...request());
		seen.push('read');
		await new Promise((ok) => setImmediate(ok));
		expect(seen).toEqual(['read', 'handled']);

		seen.length = 0;
		const atOnce = await router(seen);
		atOnce.attach = atOnce.handler;
		atOnce.attach(...request());
		seen.push('read');
		expect(seen).toEqual(['handled', 'read']);
	});
});
