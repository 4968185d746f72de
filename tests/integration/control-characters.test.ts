/** Text with control characters answers a clear 400 from the API, never a database error (500). */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openWorld, fakeEvent, type World } from './harness';
import * as teamsApi from '../../src/routes/api/v1/teams/+server';
import * as gamesApi from '../../src/routes/api/v1/teams/[teamId=id]/games/+server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

describe('control characters in JSON bodies', () => {
	it('a team name with NUL → 400 naming the field', async () => {
		const res = await teamsApi.POST(fakeEvent(w.callers.owner, { json: { name: 'Bad\u0000Team' } }) as never);
		expect(res.status).toBe(400);
		expect((await res.json()).error.message).toMatch(/^name: text may not contain control characters/);
	});

	it('a game name with an escape character → 400; tabs and line breaks stay allowed by this check', async () => {
		const bad = await gamesApi.POST(fakeEvent(w.callers.owner, { params: { teamId: w.teamId }, json: { name: 'Game\u001b[31m' } }) as never);
		expect(bad.status).toBe(400);
		const good = await gamesApi.POST(fakeEvent(w.callers.owner, { params: { teamId: w.teamId }, json: { name: 'Plain game name' } }) as never);
		expect(good.status).toBe(201);
	});
});
