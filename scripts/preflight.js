// Before any test: the machine tools the tests use. Debian's chromium (browser tests), poppler-utils
// and qpdf (independent PDF readers), liblcms2-utils (transicc, colour conversions), postgresql (the suite's second pass),
// icc-profiles-free (an sRGB display profile). When some are missing
// and we run as root with apt, they are installed; otherwise we stop at once with the command.
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { postgresBin } from './services.js';

/** An sRGB profile from Debian's icc-profiles-free (tests/integration/pdfx.test.ts). */
const SRGB_PROFILE = '/usr/share/color/icc/sRGB.icc';

const onPath = (name) => (process.env.PATH ?? '').split(':').some((dir) => dir && existsSync(join(dir, name)));

const needs = [
	{ pkg: 'chromium', present: () => (process.env.CHROMIUM_PATH ? existsSync(process.env.CHROMIUM_PATH) : onPath('chromium')) },
	{ pkg: 'poppler-utils', present: () => onPath('pdfinfo') && onPath('pdftoppm') && onPath('pdftotext') },
	{ pkg: 'qpdf', present: () => onPath('qpdf') },
	{ pkg: 'liblcms2-utils', present: () => onPath('transicc') },
	{ pkg: 'postgresql', present: () => postgresBin() !== null },
	// An sRGB display profile from outside the project, which a press-profile upload must refuse.
	{ pkg: 'icc-profiles-free', present: () => existsSync(SRGB_PROFILE) }
];

const missing = () => needs.filter((n) => !n.present()).map((n) => n.pkg);

let lacking = missing();
if (lacking.length === 0) process.exit(0);

const command = `apt-get update && apt-get install -y ${lacking.join(' ')}`;
const root = process.getuid?.() === 0;
if (root && onPath('apt-get')) {
	console.log(`The tests need ${lacking.join(', ')}; installing: ${command}`);
	const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
	const update = spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
	const install =
		update.status === 0 && spawnSync('apt-get', ['install', '-y', '-qq', ...lacking], { stdio: 'inherit', env });
	lacking = missing();
	if (install && install.status === 0 && lacking.length === 0) process.exit(0);
	console.error(`\nInstalling failed; the tests did not run. Still missing: ${lacking.join(', ')}.`);
	process.exit(1);
}

console.error(
	`The tests need ${lacking.join(', ')}, which this machine lacks; no test was run. Install with:\n\n` +
		`  sudo ${command.replace('&& apt-get', '&& sudo apt-get')}\n`
);
process.exit(1);
