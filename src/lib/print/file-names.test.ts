import { describe, expect, it } from 'vitest';
import { fileSlug, pngZipFileName, pressFileName, sheetsFileName, uniqueFileParts } from './file-names';

const proof = { gameName: 'The Marrowbed Derby', version: 'proof 3', date: '2026-12-03' };

describe('download names', () => {
	it('say the game, the version, the day and what is inside', () => {
		expect(sheetsFileName(proof, 'a4')).toBe('the-marrowbed-derby_proof-3_2026-12-03_sheets-a4.pdf');
		expect(pressFileName(proof, 'Movement cards', 'Rosehip 2')).toBe('the-marrowbed-derby_proof-3_2026-12-03_movement-cards_rosehip-2.pdf');
		expect(pngZipFileName({ ...proof, version: 'working copy v14' }, 300)).toBe('the-marrowbed-derby_working-copy-v14_2026-12-03_card-faces-300dpi.zip');
	});
	it('keep to characters every file system and zip tool takes', () => {
		expect(fileSlug('Crème brûlée / “Élan” #1')).toBe('creme-brulee-elan-1');
		expect(fileSlug('???')).toBe('file');
		expect(fileSlug('a'.repeat(100))).toHaveLength(60);
		expect(pressFileName(proof, '../../etc', 'passwd\u0000')).toMatch(/^[a-z0-9_.-]+$/);
	});
	it('give cards of the same name their own file', () => {
		const parts = uniqueFileParts(
			[
				{ id: 'a', name: 'Rosehip' },
				{ id: 'b', name: 'rosehip' },
				{ id: 'c', name: 'Rosehip 2' }
			],
			'card'
		);
		expect([...parts.values()]).toEqual(['rosehip', 'rosehip-2', 'rosehip-2-2']);
	});
});
