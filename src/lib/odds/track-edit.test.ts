import { describe, expect, it } from 'vitest';
import { dealDeck, liftRunner, nudgeRunner, placeRunner, toggleModifier } from './track-edit';

const s = { finish: 10, stacks: [{ space: 2, bottomToTop: ['a', 'b'] }], deck: [{ runner: 'b', steps: 1 }] };

describe('editing the track', () => {
	it('places a runner on top of a stack, taking it from where it stood', () => {
		expect(placeRunner(s, 'a', 4).stacks).toEqual([
			{ space: 2, bottomToTop: ['b'] },
			{ space: 4, bottomToTop: ['a'] }
		]);
		expect(placeRunner(s, 'c', 2).stacks).toEqual([{ space: 2, bottomToTop: ['a', 'b', 'c'] }]);
	});
	it('nudges within the track and lifts a runner with its cards', () => {
		expect(nudgeRunner(s, 'b', 1).stacks).toEqual([
			{ space: 2, bottomToTop: ['a'] },
			{ space: 3, bottomToTop: ['b'] }
		]);
		expect(nudgeRunner(placeRunner(s, 'a', 9), 'a', 1).stacks.find((x) => x.space === 9)).toBeDefined();
		expect(liftRunner(s, 'b')).toMatchObject({ stacks: [{ space: 2, bottomToTop: ['a'] }], deck: [] });
	});
	it('lays and lifts modifiers', () => {
		const one = toggleModifier(s, 5, 1);
		expect(one.modifiers).toEqual([{ space: 5, steps: 1 }]);
		expect(toggleModifier(one, 5, -1).modifiers).toEqual([{ space: 5, steps: -1 }]);
		expect(toggleModifier(one, 5, 1).modifiers).toEqual([]);
	});
	it('deals the shared deck size, rogue cards apart when the setup adds them', () => {
		const cards = [
			{ runner: 'a', steps: 1, copies: 5 },
			{ runner: 'r', steps: 2, copies: 3 }
		];
		expect(dealDeck(cards, { sharedCards: 4, rogueToDeck: 0 }, 'r')).toHaveLength(4);
		const apart = dealDeck(cards, { sharedCards: 4, rogueToDeck: 2 }, 'r');
		expect(apart.filter((c) => c.runner === 'r')).toHaveLength(2);
		expect(apart).toHaveLength(6);
	});
});
