/**
 * The odds API against the demo game: answers in the CLI's shape with the game's wager cards
 * priced, bad input refused with a clear 400 and nothing stored, large runs as jobs to poll,
 * saved scenarios, and race rules kept beside the rogue runner in the settings.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { openWorld, type World, actorIn } from './harness';
import { as, g } from './role-table';
import { demoStage } from './role-rows/odds';
import { oddsScenarios } from '$lib/server/db/schema';
import { loadGame, saveSettings } from '$lib/server/game-store';
import { cancelOddsJob, oddsJobView, pricesAtProof, stopOddsRunsHere, type JobView } from '$lib/server/odds';
import { cutProof, snapshotOf } from '$lib/server/proofs';
import { coinsForPlace } from '$lib/game/model';
import * as oddsApi from '../../src/routes/api/v1/games/[gameId=id]/odds/+server';
import * as scenariosApi from '../../src/routes/api/v1/games/[gameId=id]/odds/scenarios/+server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

const post = async (json: unknown) => {
	const res = await oddsApi.POST(as(w, 'designer', { params: g(w), json }));
	return { status: res.status, body: await res.json() };
};
const stored = async () => (await w.db.select().from(oddsScenarios).where(eq(oddsScenarios.gameId, w.gameId))).length;

describe('POST /api/v1/games/{gameId}/odds', () => {
	it('answers exact odds in the CLI shape, with the stage wager cards priced', async () => {
		const { status, body } = await post({ ...demoStage, exact: true });
		expect(status).toBe(200);
		expect(body.method).toBe('exact');
		expect(Object.keys(body.stage).sort()).toEqual(['rn-rosehip', 'rn-saffron', 'rn-sorrel']);
		for (const row of Object.values(body.stage) as number[][]) expect(row.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
		const game = await loadGame(w.db, w.gameId);
		const stageCards = game.cards.filter((c) => c.data.type === 'wager' && c.data.betType === 'stage' && c.data.runnerId in body.stage);
		expect(body.wagers).toHaveLength(stageCards.length);
		// One card by hand: Σ P(place) × coins of its table.
		const card = stageCards[0];
		const d = card.data.type === 'wager' ? card.data : undefined;
		const table = game.moneyTables.find((t) => t.id === d!.moneyTableId)!;
		const byHand = (body.stage[d!.runnerId] as number[]).reduce((sum, p, i) => sum + p * (coinsForPlace(table, i + 1) ?? 0), 0);
		expect(body.wagers.find((x: { cardId: string }) => x.cardId === card.id).expectedCoins).toBeCloseTo(byHand, 12);
	});

	it('answers seeded samples the same way twice', async () => {
		const a = await post({ ...demoStage, samples: 5000, seed: 9 });
		const b = await post({ ...demoStage, samples: 5000, seed: 9 });
		expect(a.body.method).toBe('monte-carlo');
		expect(a.body.samples).toBe(5000);
		expect(a.body.stage).toEqual(b.body.stage);
		expect(a.body.standardErrors['rn-rosehip']).toHaveLength(3);
	});

	it('refuses bad input with a 400 naming the problem, and stores nothing', async () => {
		const before = await stored();
		const cases: [unknown, RegExp][] = [
			[{ ...demoStage, deck: [{ runner: 'rn-nobody', steps: 1 }], exact: true }, /rn-nobody/],
			[{ ...demoStage, stacks: [...demoStage.stacks, { space: 7, bottomToTop: ['rn-sorrel'] }], exact: true }, /one stack only/],
			[{ ...demoStage, finish: -5, exact: true }, /finish must be greater than 0/],
			[{ ...demoStage, samples: 1_000_000_000 }, /at most 10,000,000/],
			[{ ...demoStage, deck: Array.from({ length: 40 }, () => ({ runner: 'rn-sorrel', steps: 1 })), exact: true }, /at most 12 cards; this deck has 40/],
			[{ race: { players: 11 }, samples: 100 }, /no setup card for 11 players/]
		];
		for (const [body, message] of cases) {
			const res = await post(body);
			expect(res.status).toBe(400);
			expect(res.body.error.message).toMatch(message);
		}
		expect(await stored()).toBe(before);
	});

	it('runs whole races from the setup card and prices every wager card', async () => {
		const { status, body } = await post({ race: { players: 4 }, samples: 500, seed: 2 });
		expect(status).toBe(200);
		const game = await loadGame(w.db, w.gameId);
		expect(body.wagers).toHaveLength(game.cards.filter((c) => c.data.type === 'wager').length);
		expect(body.stages.reduce((a: number, s: { probability: number }) => a + s.probability, 0) + body.unfinished).toBeCloseTo(1, 12);
	});

	it('hands a large run to a job that answers when polled', async () => {
		const { status, body } = await post({ ...demoStage, samples: 300_000, seed: 3 });
		expect(status).toBe(202);
		expect(body.poll).toBe(`/api/v1/odds-jobs/${body.job.id}`);
		let view: JobView = body.job;
		for (let i = 0; i < 600 && view.state !== 'done' && view.state !== 'failed'; i++) {
			await new Promise((r) => setTimeout(r, 100));
			view = await oddsJobView(w.db, w.callers.designer!.id, body.job.id);
		}
		expect(view.state).toBe('done');
		expect(view.result!.method).toBe('monte-carlo');
		expect(view.result!.wagers.length).toBeGreaterThan(0);
		// The same seed answered inline agrees with the job's answer (the job is only where it ran).
		expect(view.result!.kind === 'stage' && view.result!.samples).toBe(300_000);
	}, 90_000);

	it('cancels a run; another person cannot see or cancel it', async () => {
		const { body } = await post({ race: { players: 4 }, samples: 1_000_000, seed: 5 });
		const id = body.job.id;
		const designer = w.callers.designer!.id;
		await expect(oddsJobView(w.db, w.callers.reviewer!.id, id)).rejects.toMatchObject({ reason: 'not-found' });
		await expect(cancelOddsJob(w.db, actorIn(w, 'owner'), { id })).rejects.toMatchObject({ reason: 'not-found' });
		const cancelled = await cancelOddsJob(w.db, actorIn(w, 'designer'), { id });
		expect(cancelled.state).toBe('cancelled');
		// It stays cancelled: the worker notices and never writes an answer.
		await new Promise((r) => setTimeout(r, 1500));
		const later = await oddsJobView(w.db, designer, id);
		expect(later.state).toBe('cancelled');
		expect(later.result).toBeUndefined();
	}, 90_000);

	it('a run stopped with its process is run again by the shared queue, or else closed with a word to run it again', async () => {
		const { body } = await post({ race: { players: 4 }, samples: 200_000, seed: 6 });
		const designer = w.callers.designer!.id;
		let view: JobView = body.job;
		for (let i = 0; i < 600 && view.done === 0 && view.state !== 'done'; i++) {
			await new Promise((r) => setTimeout(r, 50));
			view = await oddsJobView(w.db, designer, body.job.id);
		}
		stopOddsRunsHere();
		const shared = !!process.env.PADDOCK_TEST_DATABASE_URL;
		for (let i = 0; i < 1200 && view.state !== 'done' && view.state !== 'failed'; i++) {
			await new Promise((r) => setTimeout(r, 100));
			view = await oddsJobView(w.db, designer, body.job.id);
		}
		if (shared) {
			expect(view.state).toBe('done');
			expect(view.result!.kind === 'race' && view.result!.samples).toBe(200_000);
		} else if (view.state !== 'done') {
			// (Unless it had already finished when the stop came.)
			expect(view.state).toBe('failed');
			expect(view.error).toBe('The server stopped during the run; run it again');
		}
	}, 180_000);
});

describe('saved scenarios', () => {
	it('saves by name, replaces on the same name, lists with the last result', async () => {
		const save = (json: unknown) => scenariosApi.POST(as(w, 'designer', { params: g(w), json }));
		expect((await save({ name: 'Opening stage', scenario: demoStage })).status).toBe(201);
		const again = await save({ name: 'Opening stage', scenario: demoStage, lastResult: { method: 'exact' } });
		expect(again.status).toBe(201);
		const list = await (await scenariosApi.GET(as(w, 'reviewer', { params: g(w) }))).json();
		const mine = list.scenarios.filter((s: { name: string }) => s.name === 'Opening stage');
		expect(mine).toHaveLength(1);
		expect(mine[0].lastResult).toEqual({ method: 'exact' });
	});

	it('refuses a broken scenario and stores nothing', async () => {
		const before = await stored();
		const res = await scenariosApi.POST(as(w, 'designer', { params: g(w), json: { name: 'Broken', scenario: { ...demoStage, finish: 0 } } }));
		expect(res.status).toBe(400);
		expect(await stored()).toBe(before);
	});
});

describe('prices at a proof', () => {
	it('prices every wager card of the snapshot, the same each time', async () => {
		const proof = await cutProof(w.db, actorIn(w, 'designer'), { description: 'priced' });
		const snapshot = snapshotOf(proof);
		const prices = await pricesAtProof(proof.id, snapshot);
		expect(prices!.wagers).toHaveLength(snapshot.cards.filter((c) => c.data.type === 'wager').length);
		expect(await pricesAtProof(proof.id, snapshot)).toEqual(prices);
	}, 90_000);
});

describe('race rules in the settings', () => {
	it('are kept when the rogue runner is saved, and travel in the game document', async () => {
		const before = await loadGame(w.db, w.gameId);
		await saveSettings(w.db, actorIn(w, 'designer'), { settings: { raceRules: { rogueCarryBonus: 2, modifiersOneUse: false, backUnder: true } }, baseVersion: null });
		const { version: _v, ...rogue } = before.rogueRunner!;
		await saveSettings(w.db, actorIn(w, 'designer'), { settings: { rogueRunner: rogue }, baseVersion: null });
		const after = await loadGame(w.db, w.gameId);
		expect(after.raceRules).toEqual({ rogueCarryBonus: 2, modifiersOneUse: false, backUnder: true });
		expect(after.rogueRunner?.name).toBe(before.rogueRunner?.name);
	});
});
