import { describe, expect, it } from 'vitest';
import { demoGame } from '$lib/demo/demo';
import { currentRun, planRun, runCards, MovementRunSchema, WagerRunSchema } from './generator';

const game = demoGame();
const kind = (id: string) => game.kinds.find((k) => k.id === id)!;
const ofKind = (id: string) => game.cards.filter((c) => c.kindId === id);

describe('generator runs', () => {
	it('reads the demo movement deck back as its matrix: 6 runners × steps 1, 2, 4, copies from the first card', () => {
		const run = currentRun(kind('kd-movement'), game);
		expect(run).toMatchObject({ type: 'movement', steps: [1, 2, 4], copies: 3 });
		expect(run?.type === 'movement' && run.runnerIds).toHaveLength(6);
		expect(MovementRunSchema.safeParse(run).success).toBe(true);
	});

	it('reads the wager tiers back per bet type, and remaking them changes nothing', () => {
		const run = currentRun(kind('kd-wager'), game)!;
		expect(WagerRunSchema.safeParse(run).success).toBe(true);
		expect(run.type === 'wager' && run.tiers.stage).toEqual(['mt-stage-1', 'mt-stage-2']);
		expect(run.type === 'wager' && run.tiers.winner).toEqual(['mt-winner-1', 'mt-winner-2', 'mt-winner-3', 'mt-winner-4']);
		const plan = planRun(game.cards, 'kd-wager', runCards(kind('kd-wager'), game, run), true);
		expect(plan).toMatchObject({ added: 0, updated: 0, removed: 0, unchanged: ofKind('kd-wager').length, writes: [] });
	});

	it('plans a smaller matrix as updates, additions and removals of the kind only', () => {
		const run = { type: 'movement' as const, runnerIds: ['rn-rosehip'], steps: [1, 3], copies: 2, replace: true };
		const plan = planRun(game.cards, 'kd-movement', runCards(kind('kd-movement'), game, run), true);
		// Rosehip 1 changes copies, Rosehip 3 is new, the other 17 demo cards go.
		expect([plan.updated, plan.added, plan.removed]).toEqual([1, 1, 17]);
		expect(plan.writes.every((w) => w.id.startsWith('kd-movement.'))).toBe(true);
		const kept = planRun(game.cards, 'kd-movement', runCards(kind('kd-movement'), game, run), false);
		expect(kept.removed).toBe(0);
	});

	it('refuses a run for another type of kind, and rogue cards without a rogue runner', () => {
		expect(() => runCards(kind('kd-wager'), game, { type: 'rogue', steps: [1], copies: 1, replace: true })).toThrow(/holds wager cards/);
		const noRogue = { ...game, rogueRunner: undefined };
		expect(() => runCards(kind('kd-rogue'), noRogue, { type: 'rogue', steps: [1], copies: 1, replace: true })).toThrow(/no rogue runner/);
	});
});
