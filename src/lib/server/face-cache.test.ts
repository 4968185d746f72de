/**
 * The face cache and its key map are bounded by bytes: filled past their budgets they stay within
 * them, and the least recently used entries are the ones that go.
 */
import { describe, expect, it } from 'vitest';
import { FACE_CACHE_BYTES, KEY_CACHE_BYTES, faceCacheStats, keepFace, keptFace, knownKey, rememberKey } from './face-cache';

describe('face cache', () => {
	it('keeps rendered faces within its byte budget, dropping the least recently used', () => {
		// A face as kept runs to some KB of text.
		const svg = 'x'.repeat(10_000);
		const count = Math.ceil(FACE_CACHE_BYTES / (svg.length * 2)) * 2;
		keepFace('face-0', { svg, art: [], warnings: 0 });
		for (let i = 1; i < count; i++) {
			keepFace(`face-${i}`, { svg, art: [], warnings: 0 });
			// face-0 is read all along, so it stays the most recently used.
			expect(keptFace('face-0')).toBeDefined();
		}
		const stats = faceCacheStats();
		expect(stats.bytes).toBeLessThanOrEqual(FACE_CACHE_BYTES);
		expect(stats.entries).toBeLessThan(count);
		expect(keptFace('face-1')).toBeUndefined();
		expect(keptFace(`face-${count - 1}`)).toBeDefined();
	});

	it('keeps the version-to-content key map within its byte budget', () => {
		const contentKey = 'c'.repeat(64);
		const versionKey = (i: number) => `game-${i}:7:card-${i}:front:svg`;
		const count = Math.ceil(KEY_CACHE_BYTES / (contentKey.length * 2)) + 1000;
		for (let i = 0; i < count; i++) rememberKey(versionKey(i), contentKey);
		const { keys } = faceCacheStats();
		expect(keys.bytes).toBeLessThanOrEqual(KEY_CACHE_BYTES);
		expect(keys.entries).toBeLessThan(count);
		expect(knownKey(versionKey(0))).toBeUndefined();
		expect(knownKey(versionKey(count - 1))).toBe(contentKey);
	});
});
