// The built server's entry (build/index.js, written by the Node adapter) is changed in two ways.
//
// Its first module becomes ./helper-threads.js (copied beside it), which lowers the priority of
// the threads V8 does its background work on.
//
// It handed each request to the app through `setImmediate`. A request read while the server was
// busy then waited behind every callback queued before it, so a plain `/api/v1/me` waited a whole
// turn of the event loop behind print builds. The adapter's handler is meant to be called straight
// from Node's `request` event (it works with `http.createServer` alone), so after each build the
// entry calls it there.
import { copyFileSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';

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

const HELPERS_FIRST = "import './helper-threads.js'; // first: see scripts/helper-threads.js";

/**
 * The entry's source with ./helper-threads.js as its first module, so it runs before any other
 * module of the app starts a thread of its own.
 * @param {string} source
 */
export function lowerHelpersFirst(source) {
	return source.startsWith(HELPERS_FIRST) ? source : `${HELPERS_FIRST}\n${source}`;
}

/** @param {string} path */
export function rewriteServerEntry(path) {
	copyFileSync(new URL('./helper-threads.js', import.meta.url), join(dirname(path), 'helper-threads.js'));
	writeFileSync(path, lowerHelpersFirst(handleRequestsAtOnce(readFileSync(path, 'utf8'))));
}
