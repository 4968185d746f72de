/**
 * Worker threads that run a TypeScript module of the source tree (no build step): the thread
 * registers tsx's loader, then imports the module. Node 20 applies `--import` hooks given in a
 * worker's execArgv only after its entry point has been resolved, so a `.ts` entry fails there;
 * registering from a small script always works.
 */
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';

/** What a worker is started with; the module reads its own part from `workerData`. */
export interface TsWorkerData {
	entry: string;
	/** tsx's register API, when the entry is TypeScript. */
	tsx?: string;
}

/**
 * Where a worker module is: `name` beside the calling module (`here` = its import.meta.url) when
 * running from source; otherwise (bundled somewhere else) `fallback` under the working directory.
 */
export function resolveWorkerModule(here: string, name: string, fallback: string, explicit?: string): string {
	if (explicit) return resolve(process.cwd(), explicit);
	// Not `new URL('./worker.ts', import.meta.url)`: a bundler would copy the file as an asset.
	try {
		const beside = join(dirname(fileURLToPath(here)), name);
		if (existsSync(beside)) return beside;
	} catch {
		// import.meta.url is not a file URL once bundled for some targets.
	}
	return resolve(process.cwd(), fallback);
}

/**
 * Like `resolveWorkerModule`, but once the calling module is bundled (the source is not beside
 * it) the compiled worker `compiled` (written by `npm run build` into build/) is preferred, so the
 * thread needs no TypeScript loader. Falls back to the source when nothing is compiled.
 */
export function resolveCompiledWorker(here: string, name: string, fallback: string, compiled: string, explicit?: string): string {
	const source = resolveWorkerModule(here, name, fallback, explicit);
	let dir: string | undefined;
	try {
		dir = dirname(fileURLToPath(here));
	} catch {
		// import.meta.url is not a file URL once bundled for some targets.
	}
	if (explicit || (dir && dirname(source) === dir)) return source;
	// Bundled server chunks live in build/server/chunks/: the compiled worker two folders up.
	const candidates = [dir && join(dir, '..', '..', compiled), resolve(process.cwd(), 'build', compiled)];
	return candidates.find((c) => c && existsSync(c)) ?? source;
}

/** Starts a thread running `entry` (a .ts or .js file path) with `data` beside the loader's own fields. */
export function startTsWorker<D extends object>(entry: string, data: D): Worker {
	const tsx = entry.endsWith('.ts') ? tsxEsmApi() : undefined;
	const code = `
const { workerData } = require('node:worker_threads');
(async () => {
	if (workerData.tsx) {
		const api = await import(workerData.tsx);
		(api.register ?? api.default.register)();
	}
	await import(workerData.entry);
})();
`;
	const workerData: TsWorkerData & D = { ...data, entry: pathToFileURL(entry).href, tsx };
	return new Worker(code, { eval: true, workerData });
}

/** tsx's ESM register API as a file URL (its `import` export; the CommonJS build cannot be imported). */
export function tsxEsmApi(): string {
	const require = createRequire(import.meta.url);
	const manifest = require.resolve('tsx/package.json');
	const pkg = JSON.parse(readFileSync(manifest, 'utf8')) as { exports: Record<string, { import: { default: string } }> };
	return pathToFileURL(resolve(dirname(manifest), pkg.exports['./esm/api'].import.default)).href;
}
