// The built server's entry (build/index.js, written by the Node adapter) hands each request to the
// app through `setImmediate`. A request read while the server is busy then waits behind every
// callback queued before it, so a plain `/api/v1/me` waited a whole turn of the event loop behind
// print builds. The adapter's handler is meant to be called straight from Node's `request` event
// (it works with `http.createServer` alone), so after each build the entry calls it there.
import { readFileSync, writeFileSync } from 'node:fs';

const MOUNT = 'const server = polka({ server: httpServer }).use(handler);';
const AT_ONCE = 'server.attach = server.handler; // each request is handled as soon as it is read (scripts/server-entry.js)';

/**
 * The entry's source with requests handled at once; throws when the adapter's entry no longer reads as expected.
 * @param {string} source
 */
export function handleRequestsAtOnce(source) {
	if (source.includes(AT_ONCE)) return source;
	const at = source.indexOf(MOUNT);
	if (at < 0 || source.indexOf(MOUNT, at + 1) >= 0) throw new Error('build/index.js no longer mounts the handler as expected: see scripts/server-entry.js');
	return source.replace(MOUNT, `${MOUNT}\n${AT_ONCE}`);
}

/** @param {string} path */
export function rewriteServerEntry(path) {
	writeFileSync(path, handleRequestsAtOnce(readFileSync(path, 'utf8')));
}
