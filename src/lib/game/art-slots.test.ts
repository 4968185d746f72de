import { describe, expect, it } from 'vitest';
import { slotLabel, slotLabelIn } from './art-slots';

describe('art slot labels', () => {
	it('names the usual slots in words', () => {
		expect(slotLabel('portrait')).toBe('Main picture');
		expect(slotLabel('backArt')).toBe('Card back');
		expect(slotLabel('icon')).toBe('Icon');
	});
	it('splits a slot name of its own into words', () => {
		expect(slotLabel('flavourArt')).toBe('Flavour art');
		expect(slotLabel('corner_badge')).toBe('Corner badge');
		expect(slotLabel('logo2Small')).toBe('Logo2 small');
	});
	it("says when a slot is the kind's shared back", () => {
		const shared = { back: { mode: 'shared', template: 'back', params: {}, artSlot: 'backArt' } } as const;
		expect(slotLabelIn(shared, 'backArt')).toBe('Card back (shared by every card)');
		expect(slotLabelIn(shared, 'portrait')).toBe('Main picture');
	});
});
