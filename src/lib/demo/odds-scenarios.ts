/**
 * The demo game's saved odds scenarios: stages of The Marrowbed Derby set up on the track, ready
 * to run on the Odds tab. Positions and cards are made up for the demo.
 */
import type { ScenarioInput } from '$lib/odds/scenario';

export const DEMO_SCENARIOS: { name: string; scenario: ScenarioInput }[] = [
	{
		name: 'Third stage, Rosehip in front',
		scenario: {
			finish: 41,
			stacks: [
				{ space: 6, bottomToTop: ['rn-marigold'] },
				{ space: 8, bottomToTop: ['rn-pebble', 'rn-sorrel'] },
				{ space: 10, bottomToTop: ['rn-bramble'] },
				{ space: 12, bottomToTop: ['rn-saffron', 'rn-rosehip'] },
				{ space: 19, bottomToTop: ['rn-burrowback'] }
			],
			rogue: { runner: 'rn-burrowback' },
			modifiers: [
				{ space: 9, steps: 1 },
				{ space: 14, steps: -1 }
			],
			rules: { rogueCarryBonus: 1, modifiersOneUse: true, backUnder: true },
			deck: [
				{ runner: 'rn-rosehip', steps: 2 },
				{ runner: 'rn-saffron', steps: 1 },
				{ runner: 'rn-sorrel', steps: 3 },
				{ runner: 'rn-pebble', steps: 2 },
				{ runner: 'rn-bramble', steps: 3 },
				{ runner: 'rn-marigold', steps: 2 },
				{ runner: 'rn-marigold', steps: 3 },
				{ runner: 'rn-burrowback', steps: 2 },
				{ runner: 'rn-sorrel', steps: 1 },
				{ runner: 'rn-bramble', steps: 1 }
			]
		}
	}
];
