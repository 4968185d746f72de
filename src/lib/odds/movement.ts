/**
 * The movement model on typed arrays: one `Track` per scenario, a reusable `RaceState`, and
 * `playCard` that moves a runner by one card. Nothing allocates per move, so the exact
 * enumeration and the Monte Carlo loops can call it hundreds of millions of times.
 *
 * The rules (every number from `RaceRules`):
 * 1. A card moves its runner and everyone stacked above it `steps` spaces, order kept; the group
 *    lands on top of whoever stands on the landing space.
 * 2. The rogue moves backwards, `rogueCarryBonus` further when anyone rides on it. It stacks and
 *    is stacked on like anyone else but is never ranked.
 * 3. A modifier on the landing space moves the group on by its `steps` in the mover's direction:
 *    forward lands on top; back slides under the stack there (`backUnder`, else on top). One
 *    modifier acts per move (no chaining); with `modifiersOneUse` it is then removed.
 * 4. The race ends at once when a ranked runner reaches `finish`.
 * 5. A group pushed behind the start waits on space 0, unstacked: its runners share the last
 *    places, each tied place split equally.
 */
import type { RaceRules } from '../game/model';

/** Everything fixed for one race or stage: who runs, the finish, the modifiers, the rules. */
export interface Track {
	/** Runners on the track; the ranked ones are 0..ranked-1, the rogue (if any) is `ranked`. */
	runners: number;
	ranked: number;
	/** Runner index of the rogue, or -1. */
	rogue: number;
	finish: number;
	rules: RaceRules;
	/** Modifier index standing on each space 0..finish-1, or -1. */
	modifierAt: Int8Array;
	modifierSteps: Int8Array;
	modifiers: number;
}

/** Positions, stack heights (0 = bottom) and which modifiers are spent. */
export interface RaceState {
	pos: Int16Array;
	height: Int8Array;
	/** Bit i set: modifier i has been used up. */
	spent: number;
	/** A ranked runner reached the finish. */
	over: boolean;
	/** Scratch: the moving group, bottom to top. */
	group: Int8Array;
}

export function newTrack(
	runners: number,
	ranked: number,
	finish: number,
	rules: RaceRules,
	modifiers: readonly { space: number; steps: number }[] = []
): Track {
	if (modifiers.length > 30) throw new Error('At most 30 modifiers');
	const modifierAt = new Int8Array(finish).fill(-1);
	const modifierSteps = new Int8Array(modifiers.length);
	modifiers.forEach((m, i) => {
		if (m.space >= 1 && m.space < finish) modifierAt[m.space] = i;
		modifierSteps[i] = m.steps;
	});
	return { runners, ranked, rogue: runners > ranked ? ranked : -1, finish, rules, modifierAt, modifierSteps, modifiers: modifiers.length };
}

export function newState(track: Track): RaceState {
	return {
		pos: new Int16Array(track.runners),
		height: new Int8Array(track.runners),
		spent: 0,
		over: false,
		group: new Int8Array(track.runners)
	};
}

export function copyState(from: RaceState, to: RaceState): void {
	to.pos.set(from.pos);
	to.height.set(from.height);
	to.spent = from.spent;
	to.over = from.over;
}

/**
 * Puts the group (state.group[0..size), bottom to top) on space `to`: on top of whoever stands
 * there, or under them. Behind the start (to < 1) everyone waits on space 0, unstacked.
 */
function land(track: Track, s: RaceState, size: number, to: number, onTop: boolean): void {
	const { pos, height, group } = s;
	if (to < 1) {
		for (let k = 0; k < size; k++) {
			pos[group[k]] = 0;
			height[group[k]] = 0;
		}
		return;
	}
	// The group still stands where it came from, and every move goes somewhere else (steps ≠ 0),
	// so whoever stands on `to` now is someone else.
	let there = 0;
	for (let j = 0; j < track.runners; j++) {
		if (pos[j] !== to) continue;
		there++;
		if (!onTop) height[j] += size;
	}
	const base = onTop ? there : 0;
	for (let k = 0; k < size; k++) {
		pos[group[k]] = to;
		height[group[k]] = base + k;
	}
}

/** Plays one card: `runner` moves `steps`. Returns true when the race is over. */
export function playCard(track: Track, s: RaceState, runner: number, steps: number): boolean {
	const { pos, height, group } = s;
	const from = pos[runner];
	let size = 0;
	if (from === 0) {
		group[size++] = runner;
	} else {
		const h = height[runner];
		for (let j = 0; j < track.runners; j++)
			if (pos[j] === from && height[j] >= h) {
				group[height[j] - h] = j;
				size++;
			}
	}
	const dir = runner === track.rogue ? -1 : 1;
	const distance = dir < 0 && size > 1 ? steps + track.rules.rogueCarryBonus : steps;
	let to = from + dir * distance;
	land(track, s, size, to, true);
	if (to >= 1 && to < track.finish) {
		const m = track.modifierAt[to];
		if (m >= 0 && (s.spent & (1 << m)) === 0) {
			const push = track.modifierSteps[m];
			if (track.rules.modifiersOneUse) s.spent |= 1 << m;
			to += dir * push;
			land(track, s, size, to, push > 0 || !track.rules.backUnder);
		}
	}
	if (to >= track.finish)
		for (let k = 0; k < size; k++)
			if (group[k] < track.ranked) {
				s.over = true;
				break;
			}
	return s.over;
}

/**
 * The ranked runners in finishing order into `order` (first place first): further along first;
 * on one space, higher in the stack first. Returns how many stand on space 0 (they share the last
 * places). Insertion sort: at most 8 runners.
 */
export function rankInto(track: Track, s: RaceState, order: Int8Array): number {
	const { pos, height } = s;
	let behind = 0;
	for (let i = 0; i < track.ranked; i++) {
		if (pos[i] === 0) behind++;
		let k = i;
		while (k > 0) {
			const o = order[k - 1];
			if (pos[o] > pos[i] || (pos[o] === pos[i] && height[o] >= height[i])) break;
			order[k] = o;
			k--;
		}
		order[k] = i;
	}
	return behind;
}

/**
 * 840 = lcm(1..8): a tie among up to 8 runners splits into whole parts of 840, so tallies stay
 * exact integers in a Float64Array and sums do not depend on the order they are added in.
 */
export const SHARE_UNITS = 840;

/**
 * Adds one finishing order to a places tally (`ranked × ranked`, row = runner, column = place),
 * in units of SHARE_UNITS, scaled by `weight`; `squares` (optional) gets the squared shares.
 */
export function tallyOrder(
	ranked: number,
	order: Int8Array,
	behind: number,
	tally: Float64Array,
	weight: number,
	squares?: Float64Array
): void {
	const clear = ranked - behind;
	for (let place = 0; place < clear; place++) {
		const at = order[place] * ranked + place;
		tally[at] += SHARE_UNITS * weight;
		if (squares) squares[at] += SHARE_UNITS * SHARE_UNITS * weight;
	}
	if (behind === 0) return;
	const share = SHARE_UNITS / behind;
	for (let k = clear; k < ranked; k++) {
		const r = order[k];
		for (let place = clear; place < ranked; place++) {
			const at = r * ranked + place;
			tally[at] += share * weight;
			if (squares) squares[at] += share * share * weight;
		}
	}
}
