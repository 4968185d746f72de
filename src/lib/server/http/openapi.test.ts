import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openApiDocument } from './openapi';
import { PrintJobSchema } from '$lib/schemas/api';

describe('the OpenAPI document', () => {
	const doc = openApiDocument();

	it('is OpenAPI 3.1 with every reference resolved and every path parameter declared', () => {
		expect(doc.openapi).toBe('3.1.0');
		const text = JSON.stringify(doc);
		for (const [, name] of text.matchAll(/"\$ref":"#\/components\/schemas\/([^"]+)"/g)) expect(doc.components.schemas).toHaveProperty(name);
		for (const [path, ops] of Object.entries(doc.paths))
			for (const o of Object.values(ops as Record<string, { parameters?: { name: string }[]; responses: object }>)) {
				expect(Object.keys(o.responses).length).toBeGreaterThan(0);
				const named = [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);
				expect((o.parameters ?? []).map((p) => p.name)).toEqual(named);
			}
	});

	it('describes answers with the schemas the routes answer with', () => {
		const job = doc.components.schemas.PrintJob as { properties: Record<string, unknown>; required: string[] };
		expect(Object.keys(job.properties).sort()).toEqual(Object.keys(PrintJobSchema.shape).sort());
		expect(job.required).toEqual(expect.arrayContaining(['id', 'state', 'done', 'total', 'warnings']));
		expect(doc.paths['/api/v1/print-jobs/{jobId}'].get.responses[200]).toMatchObject({
			content: { 'application/json': { schema: { $ref: '#/components/schemas/PrintJob' } } }
		});
	});

	it('describes every operation under /api/v1', () => {
		const ROUTES = resolve(__dirname, '../../../routes');
		const servers = (dir: string): string[] =>
			readdirSync(dir).flatMap((n) => {
				const p = join(dir, n);
				return statSync(p).isDirectory() ? servers(p) : n === '+server.ts' ? [p] : [];
			});
		const operations = servers(join(ROUTES, 'api/v1')).flatMap((f) => {
			// [gameId=id] → {gameId}: the folder names are the document's path parameters.
			const path = '/' + relative(ROUTES, dirname(f)).replace(/\[(\w+)(=\w+)?\]/g, '{$1}');
			const methods = [...readFileSync(f, 'utf8').matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => m[1].toLowerCase());
			return methods.map((m) => `${m.toUpperCase()} ${path}`);
		});
		expect(operations.length).toBeGreaterThan(50);
		const described = new Set(Object.entries(doc.paths).flatMap(([path, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${path}`)));
		expect(operations.filter((o) => !described.has(o))).toEqual([]);
		expect([...described].filter((o) => !operations.includes(o))).toEqual([]);
	});
});
