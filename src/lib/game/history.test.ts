import { describe, expect, it } from 'vitest';
import { fieldChanges, flattenFields, objectLabel } from './history';

describe('reading versions of an object', () => {
	it('flattens nested fields and leaves the version number out', () => {
		const f = flattenFields({ id: 'a', version: 3, name: 'Rosehip', data: { type: 'movement', steps: [1, 2] }, rows: [{ place: 1, coins: 5 }] });
		expect([...f]).toEqual([
			['id', 'a'],
			['name', 'Rosehip'],
			['data.type', 'movement'],
			['data.steps', '[1,2]'],
			['rows.1.place', 1],
			['rows.1.coins', 5]
		]);
	});

	it('names exactly the fields that changed, added or went', () => {
		const before = { name: 'Rosehip', colour: '#aa0000', rows: [{ place: 1, coins: 5 }, { place: 2, coins: 3 }] };
		const after = { name: 'Rosehip', colour: '#bb0000', rows: [{ place: 1, coins: 5 }, { place: 2, coins: 2 }], note: 'new' };
		expect(fieldChanges(before, after)).toEqual([
			{ field: 'colour', before: '#aa0000', after: '#bb0000' },
			{ field: 'rows.2.coins', before: 3, after: 2 },
			{ field: 'note', before: undefined, after: 'new' }
		]);
		expect(fieldChanges(after, after)).toEqual([]);
	});

	it('labels an object by its name, else its file name, else its id', () => {
		expect(objectLabel({ name: 'Mudlark' }, 'x')).toBe('Mudlark');
		expect(objectLabel({ fileName: 'boot.svg' }, 'x')).toBe('boot.svg');
		expect(objectLabel({}, 'x')).toBe('x');
	});
});
