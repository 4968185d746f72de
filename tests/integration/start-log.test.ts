/**
 * The start-up log stays short: the server bundler's notices about third-party packages are left
 * out of a successful build's output (and counted), anything else is shown, and a failed build
 * shows everything.
 */
import { describe, expect, it } from 'vitest';
import { buildLog } from '../../scripts/build-log.js';

const NOTICES = [
	'',
	'Run npm run preview to preview your production build locally.',
	'',
	'> Using @sveltejs/adapter-node',
	"node_modules/@auth/core/lib/utils/cookie.js (1:30): The 'this' keyword is equivalent to 'undefined' at the top level of an ES module, and has been rewritten",
	'Circular dependency: node_modules/typebox/build/type/engine/instantiate.mjs -> node_modules/typebox/build/type/types/call.mjs -> node_modules/typebox/build/type/engine/instantiate.mjs',
	'Circular dependency: node_modules/zod-v3-to-json-schema/dist/esm/parseDef.js -> node_modules/zod-v3-to-json-schema/dist/esm/selectParser.js -> node_modules/zod-v3-to-json-schema/dist/esm/parseDef.js',
	'Generated an empty chunk: "chunks/env.js".',
	'  ✔ done'
].join('\n');

describe('build log', () => {
	it('leaves out the third-party notices of a good build and counts them', () => {
		expect(buildLog(NOTICES, true)).toEqual({ shown: '', hidden: 4 });
	});
	it('leaves them out when the bundler colours its output too (FORCE_COLOR, as test runners set)', () => {
		const coloured = NOTICES.replace('npm run preview', '\x1b[1m\x1b[36mnpm run preview\x1b[39m\x1b[22m').replace(
			'> Using @sveltejs/adapter-node',
			'\x1b[1m> Using @sveltejs/adapter-node\x1b[22m'
		).replace('  ✔ done', '\x1b[32m  ✔ done\x1b[39m');
		expect(buildLog(coloured, true)).toEqual({ shown: '', hidden: 4 });
	});
	it('keeps anything else, such as a notice about our own code', () => {
		const own = 'Circular dependency: src/lib/a.ts -> src/lib/b.ts -> src/lib/a.ts';
		expect(buildLog(`${NOTICES}\n${own}`, true).shown).toBe(own);
	});
	it('shows everything when the build failed', () => {
		expect(buildLog(NOTICES, false).shown).toContain('Circular dependency');
	});
});
