/**
 * What may import what (README, "How the code is organised"): routes never reach the database
 * or the ORM, engine modules know nothing of the framework, the server or each other's callers,
 * services leave HTTP to $lib/server/http, and no engine folder imports itself in a circle.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = resolve(__dirname, '../..');
const SRC = join(ROOT, 'src');

function filesUnder(dir: string, keep = (f: string) => /\.(ts|svelte)$/.test(f)): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		return statSync(path).isDirectory() ? filesUnder(path, keep) : keep(path) ? [path] : [];
	});
}

const IMPORT = /(?:^|\n)\s*(?:import|export)\b[^'"`;]*?from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|(?:^|\n)\s*import\s*['"]([^'"]+)['"]/g;
function importsOf(file: string): string[] {
	const text = readFileSync(file, 'utf8');
	return [...text.matchAll(IMPORT)].map((m) => m[1] ?? m[2] ?? m[3]);
}
const isTest = (f: string) => /\.(test|spec)\.ts$/.test(f) || f.includes('/testing/');
const rel = (f: string) => relative(ROOT, f);

function offences(files: string[], forbidden: (spec: string, file: string) => boolean): string[] {
	return files.flatMap((f) => importsOf(f).filter((s) => forbidden(s, f)).map((s) => `${rel(f)} → ${s}`));
}

/** `$lib/x` or a relative path, as a path under src/lib (or the specifier when a package). */
function target(spec: string, file: string): string {
	if (spec.startsWith('$lib/')) return join(SRC, 'lib', spec.slice(5));
	if (spec.startsWith('.')) return resolve(dirname(file), spec);
	return spec;
}
const under = (spec: string, file: string, folder: string) => {
	const t = target(spec, file);
	const dir = join(SRC, 'lib', folder);
	return t === dir || t.startsWith(dir + '/');
};

const ENGINES = ['print', 'game', 'art', 'odds'];

describe('layers', () => {
	it('routes never import the database module, a driver or the ORM', () => {
		const routes = filesUnder(join(SRC, 'routes'));
		expect(routes.length).toBeGreaterThan(50);
		const bad = offences(
			routes,
			(s, f) => /^(drizzle-orm|pg|@electric-sql\/pglite)(\/|$)/.test(s) || under(s, f, 'server/db')
		);
		expect(bad).toEqual([]);
	});

	it('engine modules import no framework, server, database or UI code', () => {
		for (const engine of ENGINES) {
			const files = filesUnder(join(SRC, 'lib', engine)).filter((f) => !isTest(f));
			const bad = offences(
				files,
				(s, f) =>
					/^(@sveltejs\/kit|\$app\/|drizzle-orm|pg$|svelte$)/.test(s) ||
					['server', 'components', 'client', 'demo'].some((folder) => under(s, f, folder))
			);
			expect(bad, engine).toEqual([]);
		}
	});

	it('the game model stands alone: it imports no other engine', () => {
		const files = filesUnder(join(SRC, 'lib', 'game')).filter((f) => !isTest(f));
		expect(offences(files, (s, f) => ['print', 'art', 'odds'].some((e) => under(s, f, e)))).toEqual([]);
	});

	it('services leave HTTP to $lib/server/http', () => {
		const server = join(SRC, 'lib', 'server');
		const services = filesUnder(server).filter((f) => !isTest(f) && !f.startsWith(join(server, 'http') + '/'));
		expect(offences(services, (s) => /^(@sveltejs\/kit|\$app\/)/.test(s))).toEqual([]);
		// Services take the actor the guard resolved, never the request, and refuse in domain terms.
		const requestShaped = services.filter((f) => /\bApp\.Locals\b|\bRequestEvent\b|\bnew Response\(|\bstatus: 4\d\d\b/.test(readFileSync(f, 'utf8')));
		expect(requestShaped.map(rel)).toEqual([]);
	});

	it('services that act for someone take (db, actor, data)', () => {
		const server = join(SRC, 'lib', 'server');
		const services = filesUnder(server, (f) => f.endsWith('.ts')).filter((f) => dirname(f) === server && !isTest(f));
		// A write on someone's behalf leaves a line in the activity log; these do, yet act for nobody
		// signed in (seeding, sign-up, a queued build) or take the person in a shape of their own.
		const ACTING_FOR_NOBODY = new Set(['logActivity', 'insertGame', 'createGameFrom', 'writeGameContent']);
		const ACTOR = /^\w+\??: (Actor|TeamActor|GameActor)$/;
		const offenders: string[] = [];
		let checked = 0;
		for (const file of services) {
			const text = readFileSync(file, 'utf8');
			for (const m of text.matchAll(/export async function (\w+)(?:<[^>]*>)?\(/g)) {
				const params = parameters(text, m.index! + m[0].length - 1);
				const end = text.indexOf('\n}\n', m.index!);
				const writes = text.slice(m.index!, end).includes('logActivity(') || ['applyChanges', 'saveSettings', 'uploadArt', 'placeArt', 'restoreVersion', 'createApiToken', 'revokeApiToken', 'setMuted', 'addComment', 'resolveComment', 'giveVerdict', 'releaseProof', 'withdrawProof', 'saveScenario', 'runOdds', 'cancelOddsJob'].includes(m[1]);
				if (!writes || ACTING_FOR_NOBODY.has(m[1])) continue;
				checked++;
				const ok = params.length >= 2 && params.length <= 3 && /^\w+: Db$/.test(params[0]) && ACTOR.test(params[1]);
				if (!ok) offenders.push(`${rel(file)}: ${m[1]}(${params.join(', ')})`);
			}
		}
		expect(checked).toBeGreaterThan(20);
		expect(offenders).toEqual([]);
	});

	it('no engine folder imports itself in a circle', () => {
		for (const engine of ENGINES) {
			const files = filesUnder(join(SRC, 'lib', engine), (f) => f.endsWith('.ts') && !isTest(f));
			const graph = new Map(
				files.map((f) => [
					f,
					importsOf(f)
						.filter((s) => s.startsWith('.'))
						.map((s) => resolve(dirname(f), s).replace(/\.js$/, ''))
						.map((t) => (t.endsWith('.ts') ? t : files.includes(t + '.ts') ? t + '.ts' : join(t, 'index.ts')))
						.filter((t) => files.includes(t))
				])
			);
			const cycles: string[] = [];
			const state = new Map<string, 1 | 2>();
			const stack: string[] = [];
			const visit = (f: string) => {
				state.set(f, 1);
				stack.push(f);
				for (const next of graph.get(f) ?? []) {
					if (state.get(next) === 1) cycles.push([...stack.slice(stack.indexOf(next)), next].map(rel).join(' → '));
					else if (!state.has(next)) visit(next);
				}
				stack.pop();
				state.set(f, 2);
			};
			for (const f of files) if (!state.has(f)) visit(f);
			expect(cycles, engine).toEqual([]);
		}
	});
});

/** The parameters of the function whose opening parenthesis stands at `open`, split at top-level commas. */
function parameters(text: string, open: number): string[] {
	const out: string[] = [];
	let depth = 0;
	let start = open + 1;
	for (let i = open; i < text.length; i++) {
		const c = text[i];
		if ('([{<'.includes(c)) depth++;
		else if (')]}>'.includes(c) && text[i - 1] !== '=') {
			depth--;
			if (depth === 0) {
				out.push(text.slice(start, i));
				break;
			}
		} else if (c === ',' && depth === 1) {
			out.push(text.slice(start, i));
			start = i + 1;
		}
	}
	return out.map((p) => p.replace(/\s+/g, ' ').trim()).filter(Boolean);
}
