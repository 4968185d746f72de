/**
 * Stage odds checked against simpler methods: a plain brute-force count over every permutation
 * of the deck (its own small model of the rules on arrays of stacks, no memo, no typed arrays),
 * Monte Carlo against exact within 4 standard errors, symmetry under relabelling, sums to 1, and
 * the same seed giving the same answer.
 */
import { describe, expect, it } from 'vitest';
import { ScenarioSchema, type Scenario, type ScenarioInput } from './scenario';
import { compileStage, exactStage, ExactLimitError, monteCarloStage } from './stage';

/* ---- the reference: every permutation, counted one by one ---------------------------------- */

function permutations<T>(items: T[]): T[][] {
	if (items.length <= 1) return [items.slice()];
	return items.flatMap((item, i) => permutations([...items.slice(0, i), ...items.slice(i + 1)]).map((rest) => [item, ...rest]));
}

/** One order of the deck played on plain stacks; returns the finishing order's tied groups. */
function playPlain(s: Scenario, order: Scenario['deck']): string[][] {
	const stacks = new Map<number, string[]>(s.stacks.map((st) => [st.space, [...st.bottomToTop]]));
	const rogue = s.rogue?.runner;
	const used = new Set<number>();
	const findRunner = (r: string) => [...stacks].find(([, st]) => st.includes(r))!;
	const put = (group: string[], space: number, onTop: boolean) => {
		if (space < 1) space = 0;
		const here = stacks.get(space) ?? [];
		stacks.set(space, space === 0 || onTop ? [...here, ...group] : [...group, ...here]);
		return space;
	};
	let over = false;
	for (const card of order) {
		if (over) break;
		const [from, stack] = findRunner(card.runner);
		const at = stack.indexOf(card.runner);
		const group = from === 0 ? [card.runner] : stack.slice(at);
		stacks.set(from, from === 0 ? stack.filter((r) => r !== card.runner) : stack.slice(0, at));
		const dir = card.runner === rogue ? -1 : 1;
		const dist = card.steps + (dir < 0 && group.length > 1 ? s.rules.rogueCarryBonus : 0);
		let to = put(group, from + dir * dist, true);
		const mi = s.modifiers.findIndex((m) => m.space === to);
		if (to >= 1 && mi >= 0 && !used.has(mi)) {
			const m = s.modifiers[mi];
			if (s.rules.modifiersOneUse) used.add(mi);
			const st = stacks.get(to)!;
			stacks.set(to, st.slice(0, st.length - group.length));
			to = put(group, to + dir * m.steps, m.steps > 0 || !s.rules.backUnder);
		}
		if (to >= s.finish && group.some((r) => r !== rogue)) over = true;
	}
	const spaces = [...stacks.keys()].sort((a, b) => b - a);
	const groups: string[][] = [];
	for (const space of spaces) {
		const ranked = stacks.get(space)!.filter((r) => r !== rogue);
		if (space === 0) {
			if (ranked.length) groups.push(ranked);
		} else for (const r of [...ranked].reverse()) groups.push([r]);
	}
	return groups;
}

/** P(runner, place) by counting all n! orders of the deck (equal cards counted as distinct). */
function bruteForce(s: Scenario): Record<string, number[]> {
	const runners = s.stacks.flatMap((st) => st.bottomToTop).filter((r) => r !== s.rogue?.runner);
	const out: Record<string, number[]> = Object.fromEntries(runners.map((r) => [r, runners.map(() => 0)]));
	const orders = permutations(s.deck);
	for (const order of orders) {
		let place = 0;
		for (const tied of playPlain(s, order)) {
			for (const r of tied) for (let k = 0; k < tied.length; k++) out[r][place + k] += 1 / tied.length / orders.length;
			place += tied.length;
		}
	}
	return out;
}

const parse = (input: ScenarioInput) => ScenarioSchema.parse(input);

function exactByRunner(s: Scenario) {
	const odds = exactStage(compileStage(s));
	return Object.fromEntries(odds.runners.map((r, i) => [r, odds.places[i]]));
}

/* ---- scenarios ------------------------------------------------------------------------------ */

const example = parse({
	finish: 12,
	stacks: [
		{ space: 2, bottomToTop: ['amber', 'teal'] },
		{ space: 8, bottomToTop: ['soot'] }
	],
	rogue: { runner: 'soot' },
	modifiers: [
		{ space: 6, steps: 1 },
		{ space: 4, steps: -1 }
	],
	rules: { rogueCarryBonus: 1, modifiersOneUse: true, backUnder: true },
	deck: [
		{ runner: 'amber', steps: 1 },
		{ runner: 'teal', steps: 2 },
		{ runner: 'soot', steps: 2 }
	]
});

const busy = parse({
	finish: 9,
	stacks: [
		{ space: 1, bottomToTop: ['amber', 'teal'] },
		{ space: 2, bottomToTop: ['coal', 'soot'] },
		{ space: 4, bottomToTop: ['moss'] }
	],
	rogue: { runner: 'soot' },
	modifiers: [
		{ space: 3, steps: 2 },
		{ space: 5, steps: -2 },
		{ space: 6, steps: 1 }
	],
	deck: [
		{ runner: 'amber', steps: 2 },
		{ runner: 'teal', steps: 1 },
		{ runner: 'coal', steps: 3 },
		{ runner: 'soot', steps: 2 },
		{ runner: 'moss', steps: 2 },
		{ runner: 'amber', steps: 2 },
		{ runner: 'soot', steps: 1 }
	]
});

const behindStart = parse({
	finish: 8,
	stacks: [
		{ space: 1, bottomToTop: ['soot', 'amber', 'teal'] },
		{ space: 3, bottomToTop: ['coal'] }
	],
	rogue: { runner: 'soot' },
	rules: { rogueCarryBonus: 2, modifiersOneUse: false, backUnder: false },
	modifiers: [{ space: 4, steps: -3 }],
	deck: [
		{ runner: 'soot', steps: 1 },
		{ runner: 'coal', steps: 1 },
		{ runner: 'amber', steps: 3 },
		{ runner: 'teal', steps: 2 },
		{ runner: 'coal', steps: 2 },
		{ runner: 'soot', steps: 1 }
	]
});

const eight = parse({
	finish: 14,
	stacks: [
		{ space: 1, bottomToTop: ['amber', 'teal', 'coal'] },
		{ space: 3, bottomToTop: ['moss', 'soot'] },
		{ space: 6, bottomToTop: ['plum'] }
	],
	rogue: { runner: 'soot' },
	modifiers: [{ space: 5, steps: 1 }],
	deck: ['amber', 'teal', 'coal', 'moss', 'soot', 'plum', 'amber', 'coal'].map((runner, i) => ({ runner, steps: 1 + (i % 3) }))
});

describe('exact odds against a brute-force count of every permutation', () => {
	for (const [name, s] of [
		['the format example', example],
		['a busy stage with modifiers both ways', busy],
		['a stage that pushes runners behind the start', behindStart]
	] as const) {
		it(name, () => {
			const exact = exactByRunner(s);
			const brute = bruteForce(s);
			for (const r of Object.keys(brute))
				brute[r].forEach((p, place) => expect(exact[r][place], `${r} place ${place + 1}`).toBeCloseTo(p, 12));
		});
	}
});

describe('probabilities sum to 1', () => {
	for (const s of [example, busy, behindStart, eight]) {
		it(`${s.stacks.length} stacks, ${s.deck.length} cards`, () => {
			const odds = exactStage(compileStage(s));
			for (const row of odds.places) expect(row.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
			for (let place = 0; place < odds.runners.length; place++)
				expect(odds.places.reduce((a, row) => a + row[place], 0)).toBeCloseTo(1, 12);
		});
	}
});

describe('Monte Carlo', () => {
	it('lands within 4 standard errors of the exact answer', () => {
		for (const s of [busy, behindStart, eight]) {
			const c = compileStage(s);
			const exact = exactStage(c);
			const mc = monteCarloStage(c, 200_000, 20261203);
			exact.places.forEach((row, r) =>
				row.forEach((p, place) => {
					const se = mc.standardErrors![r][place];
					expect(Math.abs(mc.places[r][place] - p), `${exact.runners[r]} place ${place + 1}`).toBeLessThanOrEqual(4 * se + 1e-12);
				})
			);
			expect(Math.abs(mc.raceEnds - exact.raceEnds)).toBeLessThanOrEqual(4 * mc.raceEndsStandardError! + 1e-12);
		}
	});

	it('gives the same answer for the same seed, and another for another seed', () => {
		const c = compileStage(busy);
		const a = monteCarloStage(c, 100_000, 42);
		const b = monteCarloStage(compileStage(busy), 100_000, 42);
		expect(b).toEqual(a);
		expect(monteCarloStage(c, 100_000, 43).places).not.toEqual(a.places);
	});
});

describe('relabelling the runners permutes the answer', () => {
	it('swapping names and stack order', () => {
		const rename: Record<string, string> = { amber: 'zinc', teal: 'amber', coal: 'teal', moss: 'coal', soot: 'moss', zinc: 'soot' };
		const renamed = parse({
			...busy,
			stacks: busy.stacks.map((st) => ({ ...st, bottomToTop: st.bottomToTop.map((r) => rename[r]) })),
			rogue: { runner: rename['soot'] },
			deck: busy.deck.map((c) => ({ ...c, runner: rename[c.runner] }))
		});
		const before = exactByRunner(busy);
		const after = exactByRunner(renamed);
		for (const r of Object.keys(before)) expect(after[rename[r]]).toEqual(before[r]);
	});

	it('identical runners in mirrored positions get identical odds', () => {
		// amber and teal each stand alone on their own space with the same cards: same odds.
		const s = parse({
			finish: 10,
			stacks: [
				{ space: 1, bottomToTop: ['amber'] },
				{ space: 2, bottomToTop: ['coal'] }
			],
			deck: [
				{ runner: 'amber', steps: 2 },
				{ runner: 'coal', steps: 1 },
				{ runner: 'amber', steps: 1 },
				{ runner: 'coal', steps: 2 }
			]
		});
		const swapped = parse({ ...s, stacks: [{ space: 1, bottomToTop: ['coal'] }, { space: 2, bottomToTop: ['amber'] }] });
		const a = exactByRunner(s);
		const b = exactByRunner(swapped);
		expect(b.coal).toEqual(a.amber);
		expect(b.amber).toEqual(a.coal);
	});
});

describe('limits', () => {
	it('refuses a deck larger than the exact limit, naming the limit', () => {
		const deck = Array.from({ length: 40 }, (_, i) => ({ runner: i % 2 ? 'amber' : 'teal', steps: 1 + (i % 3) }));
		const s = parse({ finish: 30, stacks: [{ space: 1, bottomToTop: ['amber', 'teal'] }], deck });
		expect(() => exactStage(compileStage(s))).toThrow(ExactLimitError);
		expect(() => exactStage(compileStage(s))).toThrow(/at most 12 cards; this deck has 40/);
	});

	it('an eight-card deck is enumerated through far fewer states than its 40,320 orders', () => {
		const odds = exactStage(compileStage(eight));
		expect(odds.nodes).toBeLessThan(40_320);
	});
});
