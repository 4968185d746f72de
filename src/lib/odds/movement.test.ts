/**
 * Hand-worked races: each rule of the movement model played out card by card, with the track
 * written down after every card (space: bottom → top). The expected positions were worked out
 * by hand from the rules, not by running the code.
 */
import { describe, expect, it } from 'vitest';
import { playCard, rankInto, type RaceState } from './movement';
import { ScenarioSchema, type ScenarioInput } from './scenario';
import { compileStage, exactStage, type CompiledStage } from './stage';

/** A scenario's start, ready to play cards on by runner id. */
function table(input: Omit<ScenarioInput, 'deck'>) {
	const c = compileStage(ScenarioSchema.parse({ ...input, deck: [] }));
	const s: RaceState = { ...c.start, pos: c.start.pos.slice(), height: c.start.height.slice(), group: c.start.group.slice() };
	const play = (runner: string, steps: number) => playCard(c.track, s, c.names.indexOf(runner), steps);
	return { c, s, play, track: () => track(c, s) };
}

/** The track as `{ space: [bottom, …, top] }` (space 0 sorted by name: no stacking there). */
function track(c: CompiledStage, s: RaceState): Record<number, string[]> {
	const out: Record<number, string[]> = {};
	c.names.forEach((name, i) => {
		(out[s.pos[i]] ??= [])[s.pos[i] === 0 ? out[s.pos[i]].length : s.height[i]] = name;
	});
	if (out[0]) out[0].sort();
	return out;
}

function finishingOrder(c: CompiledStage, s: RaceState) {
	const order = new Int8Array(c.track.ranked);
	const behind = rankInto(c.track, s, order);
	return { order: [...order].map((i) => c.names[i]), behind };
}

describe('rule 1: a card moves its runner and everyone above it, landing on top', () => {
	it('carries the riders and keeps their order', () => {
		// Start: 2: [amber, teal]   4: [coal]
		const t = table({ finish: 20, stacks: [{ space: 2, bottomToTop: ['amber', 'teal'] }, { space: 4, bottomToTop: ['coal'] }] });
		// amber 2: amber carries teal from 2 to 4, onto coal → 4: [coal, amber, teal]
		t.play('amber', 2);
		expect(t.track()).toEqual({ 4: ['coal', 'amber', 'teal'] });
		// coal 1: coal carries amber and teal to 5 → 5: [coal, amber, teal]
		t.play('coal', 1);
		expect(t.track()).toEqual({ 5: ['coal', 'amber', 'teal'] });
		// teal 3: teal is on top, alone → 5: [coal, amber]  8: [teal]
		t.play('teal', 3);
		expect(t.track()).toEqual({ 5: ['coal', 'amber'], 8: ['teal'] });
		// amber 3: amber lands on teal → 5: [coal]  8: [teal, amber]
		t.play('amber', 3);
		expect(t.track()).toEqual({ 5: ['coal'], 8: ['teal', 'amber'] });
	});
});

describe('rule 2: the rogue moves backwards, further when carrying, and is never ranked', () => {
	const start = { finish: 20, stacks: [{ space: 5, bottomToTop: ['amber'] }, { space: 8, bottomToTop: ['soot'] }], rogue: { runner: 'soot' } };

	it('goes back; with a rider it goes rogueCarryBonus further', () => {
		const t = table(start);
		// soot 2: alone, back 2 from 8 → 6
		t.play('soot', 2);
		expect(t.track()).toEqual({ 5: ['amber'], 6: ['soot'] });
		// amber 1: 5 → 6, onto soot → 6: [soot, amber]
		t.play('amber', 1);
		expect(t.track()).toEqual({ 6: ['soot', 'amber'] });
		// soot 2 carrying amber: 2 + bonus 1 = 3 back, 6 → 3
		t.play('soot', 2);
		expect(t.track()).toEqual({ 3: ['soot', 'amber'] });
	});

	it('takes the bonus from the rules', () => {
		const t = table({ ...start, stacks: [{ space: 6, bottomToTop: ['soot', 'amber'] }], rules: { rogueCarryBonus: 0, modifiersOneUse: true, backUnder: true } });
		// soot 2 carrying amber, bonus 0: 6 → 4
		t.play('soot', 2);
		expect(t.track()).toEqual({ 4: ['soot', 'amber'] });
	});

	it('a runner under the rogue carries it forward; the rogue is left out of the ranking', () => {
		const t = table({ ...start, stacks: [{ space: 5, bottomToTop: ['amber', 'soot'] }, { space: 3, bottomToTop: ['teal'] }] });
		// amber 2 carries soot: 5 → 7 → 7: [amber, soot]
		t.play('amber', 2);
		expect(t.track()).toEqual({ 3: ['teal'], 7: ['amber', 'soot'] });
		expect(finishingOrder(t.c, t.s)).toEqual({ order: ['amber', 'teal'], behind: 0 });
	});
});

describe('rule 3: modifiers push on (on top) or back (under), once, without chaining', () => {
	it('a forward modifier moves the group on and lands it on top, then is removed', () => {
		const t = table({
			finish: 20,
			stacks: [{ space: 4, bottomToTop: ['amber'] }, { space: 5, bottomToTop: ['coal'] }, { space: 7, bottomToTop: ['teal'] }],
			modifiers: [{ space: 6, steps: 1 }]
		});
		// amber 2: 4 → 6, the +1 modifier moves it on to 7, on top of teal → 7: [teal, amber]
		t.play('amber', 2);
		expect(t.track()).toEqual({ 5: ['coal'], 7: ['teal', 'amber'] });
		// coal 1: 5 → 6; the modifier is used up, coal stays on 6
		t.play('coal', 1);
		expect(t.track()).toEqual({ 6: ['coal'], 7: ['teal', 'amber'] });
	});

	it('with modifiersOneUse off the modifier acts again', () => {
		const t = table({
			finish: 20,
			stacks: [{ space: 4, bottomToTop: ['amber'] }, { space: 5, bottomToTop: ['coal'] }],
			modifiers: [{ space: 6, steps: 1 }],
			rules: { rogueCarryBonus: 1, modifiersOneUse: false, backUnder: true }
		});
		t.play('amber', 2); // 4 → 6 → 7
		t.play('coal', 1); // 5 → 6 → 7, on top of amber
		expect(t.track()).toEqual({ 7: ['amber', 'coal'] });
	});

	it('a back modifier slides the group under the stack there (backUnder), or on top when off', () => {
		const stacks = [{ space: 2, bottomToTop: ['amber', 'coal'] }, { space: 3, bottomToTop: ['teal'] }];
		const under = table({ finish: 20, stacks, modifiers: [{ space: 4, steps: -1 }] });
		// amber 2 carries coal: 2 → 4, the −1 modifier pulls them back to 3, under teal → 3: [amber, coal, teal]
		under.play('amber', 2);
		expect(under.track()).toEqual({ 3: ['amber', 'coal', 'teal'] });
		const onTop = table({ finish: 20, stacks, modifiers: [{ space: 4, steps: -1 }], rules: { rogueCarryBonus: 1, modifiersOneUse: true, backUnder: false } });
		onTop.play('amber', 2);
		expect(onTop.track()).toEqual({ 3: ['teal', 'amber', 'coal'] });
	});

	it('does not chain: a modifier where the push lands does nothing', () => {
		const t = table({ finish: 20, stacks: [{ space: 4, bottomToTop: ['amber'] }], modifiers: [{ space: 6, steps: 1 }, { space: 7, steps: 2 }] });
		// amber 2: 4 → 6 → 7 (the +2 on 7 does not act in the same move)
		t.play('amber', 2);
		expect(t.track()).toEqual({ 7: ['amber'] });
	});

	it('moves the rogue on in its own direction', () => {
		const t = table({ finish: 20, stacks: [{ space: 9, bottomToTop: ['soot'] }, { space: 5, bottomToTop: ['amber'] }], rogue: { runner: 'soot' }, modifiers: [{ space: 7, steps: 1 }] });
		// soot 2: 9 → 7, the +1 modifier moves it one further its way (back) → 6
		t.play('soot', 2);
		expect(t.track()).toEqual({ 5: ['amber'], 6: ['soot'] });
	});
});

describe('rule 4: the race ends at once at the finish; a stage ends when its deck is empty', () => {
	it('stops on reaching the finish', () => {
		const t = table({ finish: 10, stacks: [{ space: 8, bottomToTop: ['amber'] }, { space: 3, bottomToTop: ['coal'] }] });
		expect(t.play('coal', 2)).toBe(false); // 3 → 5
		expect(t.play('amber', 2)).toBe(true); // 8 → 10 = finish: over
	});

	it('a runner reaching the finish ends the stage before the rest of the deck', () => {
		// amber on 8, finish 10: deck {amber 2, coal 3}. coal starts on 6.
		// Order amber 2, coal 3: amber 8 → 10, race over; coal never moves → amber 1st, coal 2nd.
		// Order coal 3, amber 2: coal 6 → 9, then amber 8 → 10 → amber 1st, coal 2nd.
		// Both orders: amber first; P(race ends) = 1.
		const odds = exactStage(
			compileStage(
				ScenarioSchema.parse({
					finish: 10,
					stacks: [{ space: 8, bottomToTop: ['amber'] }, { space: 6, bottomToTop: ['coal'] }],
					deck: [{ runner: 'amber', steps: 2 }, { runner: 'coal', steps: 3 }]
				})
			)
		);
		expect(odds.places).toEqual([
			[1, 0],
			[0, 1]
		]);
		expect(odds.raceEnds).toBe(1);
	});

	it('the rogue reaching the finish does not end the race', () => {
		const t = table({ finish: 10, stacks: [{ space: 8, bottomToTop: ['soot', 'amber'] }, { space: 3, bottomToTop: ['coal'] }], rogue: { runner: 'soot' } });
		// coal 5: 3 → 8, onto soot and amber → 8: [soot, amber, coal]; not over
		expect(t.play('coal', 5)).toBe(false);
		// soot (carrying) 1: 1 + 1 back → 6
		expect(t.play('soot', 1)).toBe(false);
		expect(t.track()).toEqual({ 6: ['soot', 'amber', 'coal'] });
	});
});

describe('rule 5: ranking, and runners behind the start sharing the last places', () => {
	it('further first, higher in a stack first', () => {
		const t = table({ finish: 20, stacks: [{ space: 5, bottomToTop: ['amber', 'coal'] }, { space: 7, bottomToTop: ['teal'] }, { space: 3, bottomToTop: ['moss'] }] });
		expect(finishingOrder(t.c, t.s)).toEqual({ order: ['teal', 'coal', 'amber', 'moss'], behind: 0 });
	});

	it('a group pushed behind the start waits on space 0, unstacked, tied for the last places', () => {
		const t = table({
			finish: 20,
			stacks: [{ space: 2, bottomToTop: ['soot', 'amber', 'coal'] }, { space: 6, bottomToTop: ['teal'] }],
			rogue: { runner: 'soot' }
		});
		// soot 2 carrying amber and coal: 2 + 1 back from 2 → −1 < 1, so all wait on 0, unstacked
		t.play('soot', 2);
		expect(t.track()).toEqual({ 0: ['amber', 'coal', 'soot'], 6: ['teal'] });
		expect(finishingOrder(t.c, t.s).behind).toBe(2);
		// amber 1 leaves space 0 alone (nobody rides on anyone there): 0 → 1
		t.play('amber', 1);
		expect(t.track()).toEqual({ 0: ['coal', 'soot'], 1: ['amber'], 6: ['teal'] });
	});

	it('splits a tied place equally so each distribution sums to 1', () => {
		// Nothing to play: teal 1st for sure; amber and coal on 0 share 2nd and 3rd half and half.
		const odds = exactStage(
			compileStage(ScenarioSchema.parse({ finish: 20, stacks: [{ space: 0, bottomToTop: ['amber', 'coal'] }, { space: 4, bottomToTop: ['teal'] }], deck: [] }))
		);
		expect(odds.runners).toEqual(['amber', 'coal', 'teal']);
		expect(odds.places).toEqual([
			[0, 0.5, 0.5],
			[0, 0.5, 0.5],
			[1, 0, 0]
		]);
	});
});
