// Part of `npm run build`: the print worker, the odds worker and the print CLI compiled to plain JavaScript
// (esbuild), so neither needs a TypeScript loader at run time. Packages stay in node_modules.
import { build } from 'esbuild';

const root = new URL('..', import.meta.url).pathname;

export async function buildPrint({ quiet = false } = {}) {
	const common = {
		absWorkingDir: root,
		bundle: true,
		platform: 'node',
		target: 'node20',
		format: 'esm',
		packages: 'external',
		sourcemap: 'linked',
		logLevel: quiet ? 'error' : 'warning',
		alias: { $lib: './src/lib' }
	};
	await Promise.all([
		build({ ...common, entryPoints: ['src/lib/print/worker.ts'], outfile: 'build/print-worker.js' }),
		build({ ...common, entryPoints: ['src/lib/odds/worker.ts'], outfile: 'build/odds-worker.js' }),
		build({ ...common, entryPoints: ['scripts/print.ts'], outfile: 'build/print.js' })
	]);
}

if (import.meta.url === `file://${process.argv[1]}`) await buildPrint();
