/**
 * Every route handler, page load and form action has at least one row in the role × route table
 * (role-rows/), and every rows file is walked by roles.test.ts. A new route fails here until it
 * gets its rows.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Row } from './role-table';

const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;

const servers = import.meta.glob<Record<string, unknown>>('/src/routes/**/+server.ts', { eager: true });
const pages = import.meta.glob<Record<string, unknown>>('/src/routes/**/+page.server.ts', { eager: true });
const layouts = import.meta.glob<Record<string, unknown>>('/src/routes/**/+layout.server.ts', { eager: true });
const rowFiles = import.meta.glob<Record<string, unknown>>('./role-rows/*.ts', { eager: true });

/** '/src/routes/(app)/games/[gameId=id]/+page.server.ts' → the URL path with each parameter as a pattern. */
function pathPattern(file: string): { path: string; pattern: string } {
	const segments = file
		.replace(/^\/src\/routes/, '')
		.split('/')
		.slice(0, -1)
		.filter((s) => s && !/^\(.*\)$/.test(s));
	const path = '/' + segments.join('/');
	const pattern = segments.map((s) => (/^\[\.\.\..*\]$/.test(s) ? '.+' : /^\[.*\]$/.test(s) ? '[^/]+' : s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')));
	return { path, pattern: '/' + pattern.join('/') };
}

/** Every entry the table needs: 'GET /api/…', 'load /games/…', 'action /games/…?/save'. */
function entries() {
	const out: { name: string; test: RegExp }[] = [];
	const add = (name: string, head: string, pattern: string, tail = '') =>
		out.push({ name, test: new RegExp(`^${head} ${pattern}${tail}(?:[ ?]|$)`) });
	for (const [file, mod] of Object.entries(servers)) {
		const { path, pattern } = pathPattern(file);
		for (const m of METHODS) if (typeof mod[m] === 'function') add(`${m} ${path}`, m, pattern);
	}
	for (const [file, mod] of Object.entries({ ...pages, ...layouts })) {
		const { path, pattern } = pathPattern(file);
		if (typeof mod.load === 'function') add(`load ${path}${file.includes('+layout') ? ' (layout)' : ''}`, 'load', pattern);
		for (const action of Object.keys((mod.actions as object | undefined) ?? {}))
			if (action === 'default') add(`action ${path}`, 'action', pattern);
			else add(`action ${path}?/${action}`, 'action', pattern, `\\?/${action}`);
	}
	return out;
}

const isRow = (v: unknown): v is Row => typeof v === 'object' && v !== null && typeof (v as Row).route === 'string' && typeof (v as Row).run === 'function';

function tableRoutes(): string[] {
	const routes: string[] = [];
	for (const mod of Object.values(rowFiles))
		for (const value of Object.values(mod)) if (Array.isArray(value)) for (const row of value) if (isRow(row)) routes.push(row.route);
	// The table writes parameters as {name}: any one segment.
	return routes.map((r) => r.replace(/\{[^}/]+\}/g, 'x'));
}

describe('the role × route table covers every route', () => {
	it('lists a row for every handler, load and form action', () => {
		const routes = tableRoutes();
		const found = entries();
		expect(found.length).toBeGreaterThan(80);
		const missing = found.filter((e) => !routes.some((r) => e.test.test(r))).map((e) => e.name);
		expect(missing).toEqual([]);
	});

	it('walks every rows file', () => {
		const walker = readFileSync(new URL('./roles.test.ts', import.meta.url), 'utf8');
		const files = Object.keys(rowFiles).map((f) => f.replace(/\.ts$/, ''));
		expect(files.filter((f) => !walker.includes(`'${f}'`))).toEqual([]);
	});
});
