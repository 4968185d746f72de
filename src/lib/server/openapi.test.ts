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
});
