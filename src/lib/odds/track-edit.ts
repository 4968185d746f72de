/**
 * Editing a scenario's track by hand (the Odds tab): put a runner on top of a space, move it a
 * space, lay or lift a modifier. Pure functions on the scenario input; each returns a new one.
 */
import type { ScenarioInput } from './scenario';

type Stacks = ScenarioInput['stacks'];

/** Where a runner stands, if anywhere. */
export function spaceOf(stacks: Stacks, runner: string): number | undefined {
	return stacks.find((s) => s.bottomToTop.includes(runner))?.space;
}

function without(stacks: Stacks, runner: string): Stacks {
	return stacks
		.map((s) => ({ ...s, bottomToTop: s.bottomToTop.filter((r) => r !== runner) }))
		.filter((s) => s.bottomToTop.length > 0);
}

/** Puts `runner` alone on top of the stack on `space` (taking it from wherever it stood). */
export function placeRunner(s: ScenarioInput, runner: string, space: number): ScenarioInput {
	const stacks = without(s.stacks, runner);
	const at = stacks.find((st) => st.space === space);
	const next = at
		? stacks.map((st) => (st === at ? { ...st, bottomToTop: [...st.bottomToTop, runner] } : st))
		: [...stacks, { space, bottomToTop: [runner] }];
	return { ...s, stacks: next.sort((a, b) => a.space - b.space) };
}

/** Takes a runner off the track (its cards stay in the deck only if it comes back). */
export function liftRunner(s: ScenarioInput, runner: string): ScenarioInput {
	return { ...s, stacks: without(s.stacks, runner), deck: s.deck.filter((c) => c.runner !== runner) };
}

/** Moves a runner one space along (−1 or +1), within 0..finish−1, onto the top there. */
export function nudgeRunner(s: ScenarioInput, runner: string, by: -1 | 1): ScenarioInput {
	const from = spaceOf(s.stacks, runner);
	if (from === undefined) return s;
	const to = Math.min(Math.max(0, from + by), Math.max(0, s.finish - 1));
	return to === from ? s : placeRunner(s, runner, to);
}

/** Lays a modifier on a space (replacing one there), or lifts it when the same one is there. */
export function toggleModifier(s: ScenarioInput, space: number, steps: number): ScenarioInput {
	const mods = s.modifiers ?? [];
	const here = mods.find((m) => m.space === space);
	const rest = mods.filter((m) => m.space !== space);
	return { ...s, modifiers: here && here.steps === steps ? rest : [...rest, { space, steps }].sort((a, b) => a.space - b.space) };
}

/** A shared deck dealt at random from the movement deck, as the setup card deals it (random play). */
export function dealDeck(
	cards: readonly { runner: string; steps: number; copies: number }[],
	setup: { sharedCards: number; rogueToDeck: number },
	rogue: string | undefined,
	random: () => number = Math.random
): ScenarioInput['deck'] {
	const expand = (list: typeof cards) => list.flatMap((c) => Array.from({ length: c.copies }, () => ({ runner: c.runner, steps: c.steps })));
	const shuffle = <T>(xs: T[]) => {
		for (let i = xs.length - 1; i > 0; i--) {
			const j = Math.floor(random() * (i + 1));
			[xs[i], xs[j]] = [xs[j], xs[i]];
		}
		return xs;
	};
	const apart = setup.rogueToDeck > 0;
	const movement = shuffle(expand(cards.filter((c) => !apart || c.runner !== rogue)));
	const rogueCards = apart ? shuffle(expand(cards.filter((c) => c.runner === rogue))).slice(0, setup.rogueToDeck) : [];
	return [...movement.slice(0, setup.sharedCards), ...rogueCards];
}
