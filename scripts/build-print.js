// Part of `npm run build`: the print worker, the odds worker and the print CLI compiled to plain JavaScript
// (esbuild), so neither needs a TypeScript loader at run time. The workers leave packages in node_modules.
// The CLI, started anew for every file, carries its plain-JavaScript packages inside (one file to load
// instead of hundreds; build/print.cjs) and loads the rest (WebAssembly, jimp) from node_modules only
// when it uses them (fontkit is inside, started on first use). build/print.js starts it from a V8 code
// cache (see LAUNCHER), made here by one run.
import { createHash } from 'node:crypto';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'esbuild';

/** Packages the CLI loads from node_modules: WebAssembly beside their JavaScript, or loaded lazily. */
const CLI_EXTERNAL = ['@resvg/resvg-wasm', 'wawoff2', 'lcms-wasm', 'jimp'];

/**
 * fontkit inside the CLI's bundle, so the V8 code cache covers it too (compiling its 1.2 MB was a
 * good part of a first run), still started only on first use: esbuild evaluates a module that
 * is reached by `require` when it is first required. Its WOFF2 decoder's dictionary is unpacked
 * on first use too, not at start: the CLI hands fontkit TrueType only (../src/lib/print/fonts.ts).
 * @type {import('esbuild').Plugin}
 */
const fontkitInBundle = {
	name: 'fontkit-in-bundle',
	setup(b) {
		b.onResolve({ filter: /\/fontkit-module$/ }, () => ({ path: 'fontkit-module', namespace: 'paddock-cli' }));
		b.onLoad({ filter: /.*/, namespace: 'paddock-cli' }, () => ({
			resolveDir: root,
			loader: 'js',
			contents: `let fontkit;\nexport function fontkitModule() {\n\treturn (fontkit ??= require('@pdf-lib/fontkit').default);\n}\n`
		}));
		b.onLoad({ filter: /@pdf-lib[\\/]fontkit[\\/]dist[\\/]fontkit\.es\.js$/ }, async (args) => {
			let code = readFileSync(args.path, 'utf8');
			/** @param {string} from @param {string} to */
			const once = (from, to) => {
				if (code.split(from).length !== 2) throw new Error(`build-print: fontkit changed (${JSON.stringify(from.slice(0, 40))} is not there once); review fontkitInBundle`);
				code = code.replace(from, to);
			};
			once('dictionary.init(BrotliDecompressBuffer);\n', '');
			once(
				'function BrotliDecompress(input, output) {\n',
				'var dictionaryReady = false;\nfunction BrotliDecompress(input, output) {\n  if (!dictionaryReady) { dictionaryReady = true; dictionary.init(BrotliDecompressBuffer); }\n'
			);
			return { contents: code, loader: 'js' };
		});
	}
};

const root = new URL('..', import.meta.url).pathname;

export async function buildPrint({ quiet = false } = {}) {
	/** @type {import('esbuild').BuildOptions} */
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
			outfile: 'build/print.cjs',
			// CommonJS: V8 code caches are made for scripts (node:vm), not for ES modules.
			format: 'cjs',
			packages: undefined,
			external: CLI_EXTERNAL,
			// ES module builds where a package has one, so unused parts can be left out.
			mainFields: ['module', 'main'],
			define: { 'import.meta.url': '__paddockUrl' },
			plugins: [fontkitInBundle],
			banner: { js: "const __paddockUrl = require('node:url').pathToFileURL(__filename).href;" }
		}).then(writeLauncher)
	]);
	makeCodeCache();
}

/**
 * Runs the compiled CLI once on the demo game, into a throw-away file and an empty face cache,
 * so that its V8 code cache exists before anyone's first run (the launcher writes it at the end
 * of a run that found none): a first run then neither compiles the bundle nor lays out with
 * cold code. It also keeps the demo art (node_modules/.cache), as any first demo run would.
 */
function makeCodeCache() {
	const dir = mkdtempSync(join(tmpdir(), 'paddock-print-build-'));
	try {
		const run = spawnSync(process.execPath, [join(root, 'build', 'print.js'), '--demo', '--cache', join(dir, 'cache'), '--out', join(dir, 'demo.pdf')], {
			cwd: root,
			encoding: 'utf8'
		});
		if (run.status !== 0) throw new Error(`build-print: the compiled CLI failed on the demo game:\n${run.stderr}`);
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

/**
 * build/print.js: runs build/print.cjs from a V8 code cache kept beside it, made by its first run
 * (compiling the bundle was a third of a repeat run). The cache is named by the bundle's hash, so a
 * rebuilt CLI never meets an old cache (V8 itself only checks the source's length); V8 refuses a
 * cache from another Node version, and the launcher then makes a new one.
 */
function writeLauncher() {
	const dir = join(root, 'build');
	const hash = createHash('sha256').update(readFileSync(join(dir, 'print.cjs'))).digest('hex').slice(0, 16);
	for (const f of readdirSync(dir)) if (/^print-[0-9a-f]+\.v8cache/.test(f)) rmSync(join(dir, f), { force: true });
	writeFileSync(join(dir, 'print.js'), LAUNCHER.replace('@HASH@', hash));
}

const LAUNCHER = `// The print CLI (scripts/print.ts), compiled to ./print.cjs by scripts/build-print.js, run from a
// V8 code cache made by its first run. Delete the .v8cache file at will: the next run makes it again.
import { readFileSync, renameSync, writeFileSync } from 'node:fs';
import Module, { createRequire } from 'node:module';
import { dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import vm from 'node:vm';

const file = fileURLToPath(new URL('./print.cjs', import.meta.url));
const cacheFile = fileURLToPath(new URL('./print-@HASH@.v8cache', import.meta.url));
let cachedData;
try {
	cachedData = readFileSync(cacheFile);
} catch {
	// None yet.
}
const script = new vm.Script(Module.wrap(readFileSync(file, 'utf8')), { filename: file, cachedData });
if (!cachedData || script.cachedDataRejected)
	process.once('exit', () => {
		try {
			// After the run: the functions it compiled go into the cache too.
			writeFileSync(cacheFile + '.' + process.pid, script.createCachedData());
			renameSync(cacheFile + '.' + process.pid, cacheFile);
		} catch {
			// A read-only build directory: the CLI runs without the cache.
		}
	});
const module = new Module(file);
module.filename = file;
script.runInThisContext()(module.exports, createRequire(file), module, file, dirname(file));
`;

if (import.meta.url === `file://${process.argv[1]}`) await buildPrint();
