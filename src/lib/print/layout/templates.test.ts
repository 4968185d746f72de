import { describe, expect, it } from 'vitest';
import { CARD_KIND_TYPES } from '../../game/model';
import { DEFAULT_FRONT_TEMPLATE } from './index';
import { FACE_MODULES, mergeParams, TEMPLATES } from './templates';

describe('built-in layouts', () => {
	it('has a layout for every card kind type and both back modes', () => {
		for (const t of CARD_KIND_TYPES) expect(TEMPLATES.get(DEFAULT_FRONT_TEMPLATE[t])).toBeDefined();
		expect(TEMPLATES.get('back')?.face).toBe('back');
		expect(TEMPLATES.get('tile-back')?.face).toBe('tile-back');
		for (const t of TEMPLATES.values()) expect(FACE_MODULES).toContain(t.face);
	});

	it('keeps every box inside its area (fractions 0..1)', () => {
		for (const t of TEMPLATES.values())
			for (const [key, v] of Object.entries(t.params))
				if (key.endsWith('Box')) {
					const b = v as { x: number; y: number; w: number; h: number };
					expect(b.x, `${t.id}.${key}`).toBeGreaterThanOrEqual(0);
					expect(b.y, `${t.id}.${key}`).toBeGreaterThanOrEqual(0);
					expect(b.x + b.w, `${t.id}.${key}`).toBeLessThanOrEqual(1 + 1e-9);
					expect(b.y + b.h, `${t.id}.${key}`).toBeLessThanOrEqual(1 + 1e-9);
				}
	});
});

describe('mergeParams', () => {
	it('overrides by key, merges objects, and refuses values of the wrong type', () => {
		const warnings: string[] = [];
		const merged = mergeParams(
			{ titlePt: 16, backgroundHex: '#ffffff', show: { name: true, art: true }, rows: [1, 2] },
			{ titlePt: 12, backgroundHex: 7, show: { art: false }, rows: [3], extra: 'kept' },
			(m) => warnings.push(m)
		);
		expect(merged).toEqual({ titlePt: 12, backgroundHex: '#ffffff', show: { name: true, art: false }, rows: [3], extra: 'kept' });
		expect(warnings).toEqual(['layout parameter backgroundHex should be a string, not a number; the default is used']);
	});
});
