/**
 * The built server's entry (scripts/server-entry.js) hands requests to the app as soon as they
 * are read. Checked against the Node adapter's own files: its entry template, and the request
 * router bundled with it, which without the change defers every request with `setImmediate`.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { handleRequestsAtOnce } from '../../scripts/server-entry.js';

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
