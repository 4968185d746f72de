// Part of `npm run build`: the print worker, the odds worker and the print CLI compiled to plain JavaScript
// (esbuild), so neither needs a TypeScript loader at run time. The workers leave packages in node_modules;
// the CLI, started anew for every file, carries its plain-JavaScript packages inside (one file to load
// instead of hundreds) and loads the rest (WebAssembly, fontkit) from node_modules only when it uses them.
import { build } from 'esbuild';

/** Packages the CLI loads from node_modules: WebAssembly beside their JavaScript, or loaded lazily. */
const CLI_EXTERNAL = ['@resvg/resvg-wasm', 'wawoff2', 'lcms-wasm', 'jimp', '@pdf-lib/fontkit'];

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
		build({
			...common,
			entryPoints: ['scripts/print.ts'],
			outfile: 'build/print.js',
			packages: undefined,
			external: CLI_EXTERNAL,
			// ES module builds where a package has one, so unused parts can be left out.
			mainFields: ['module', 'main'],
			// Bundled CommonJS code may require Node's own modules.
			banner: { js: "import { createRequire as __paddockRequire } from 'node:module';\nconst require = __paddockRequire(import.meta.url);" }
		})
	]);
}

if (import.meta.url === `file://${process.argv[1]}`) await buildPrint();
