// `npm run print`: the print CLI as plain JavaScript (build/print.js, compiled by `npm run build`);
// compiled here first when it is missing or older than its sources.
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { buildPrint } from './build-print.js';
import { isStale } from './build-if-stale.js';

const root = new URL('..', import.meta.url).pathname;
if (isStale('build/print.js', ['src/lib', 'scripts/print.ts', 'templates', 'package.json'])) await buildPrint({ quiet: true });
await import(pathToFileURL(join(root, 'build', 'print.js')).href);
