// What a build prints for people: the server bundler's notices about third-party packages left out.
import { stripVTControlCharacters } from 'node:util';

/**
 * Notices the server bundler prints about third-party packages (their own import cycles, `this` at
 * the top of an ES module, modules that bundle to nothing): nothing to act on here, and hundreds
 * of lines of them buried the address to open.
 */
const THIRD_PARTY_NOTICES = [
	/^Circular dependency: node_modules\//,
	/^node_modules\/.*The 'this' keyword is equivalent to 'undefined'/,
	/^Generated an empty chunk: /,
	/^Run npm run preview to preview/,
	/^> Using @sveltejs\/adapter-node$/,
	/^\s*✔ done$/
];

/**
 * The build's output without the third-party notices (all of it when the build fails).
 * @param {string} output
 * @param {boolean} ok
 */
export function buildLog(output, ok) {
	// Colour codes (a bundler colours its output when FORCE_COLOR is set) would hide a notice from the patterns.
	const lines = stripVTControlCharacters(output).split(/\r?\n/);
	if (!ok) return { shown: lines.join('\n').trim(), hidden: 0 };
	const shown = lines.filter((/** @type {string} */ l) => l.trim() && !THIRD_PARTY_NOTICES.some((re) => re.test(l)));
	return { shown: shown.join('\n'), hidden: lines.filter((/** @type {string} */ l) => THIRD_PARTY_NOTICES.slice(0, 3).some((re) => re.test(l))).length };
}
