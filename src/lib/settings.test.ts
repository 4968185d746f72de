import { describe, expect, it } from 'vitest';
import { countSetting } from './settings';

describe('countSetting', () => {
	it('takes a whole number of at least one, and the default for anything else', () => {
		expect(countSetting('3', 7)).toBe(3);
		expect(countSetting(' 12 ', 7)).toBe(12);
		for (const bad of [undefined, '', ' ', '0', '-2', '1.5', 'many', 'NaN', 'Infinity']) expect(countSetting(bad, 7)).toBe(7);
	});
});
