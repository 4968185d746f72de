/**
 * Every JSON write route under /api/v1 refuses a key it does not know with 400 and a message
 * naming the key, and stores nothing: a stray `bleedMm` on a card kind is an error, not a
 * silently dropped field. The route list is read from the source tree, so a new JSON route
 * without a row here fails the walk.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { openWorld, fakeEvent, type World, type Who, actorIn } from './harness';
import { loadGame } from '$lib/server/game-store';
import { DEFAULT_PROFILE } from '$lib/schemas/printing';
import { cutProof } from '$lib/server/proofs';
import { saveProfile } from '$lib/server/printer-profiles';
import { historyOf } from '$lib/server/history';

const API = join(process.cwd(), 'src/routes/api/v1');

/** Route files (relative to src/routes/api/v1) whose handlers read a JSON body. */
function jsonRoutes(dir = API): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		if (statSync(path).isDirectory()) return jsonRoutes(path);
		return name === '+server.ts' && readFileSync(path, 'utf8').includes('readJson(') ? [relative(API, path)] : [];
	});
}

type Handler = (event: never) => Promise<Response>;

interface Row {
	/** The route file under src/routes/api/v1. */
	file: string;
	method: 'POST' | 'PUT' | 'PATCH' | 'DELETE';
	who: Who;
	params: () => Record<string, string>;
	/** A body the route accepts as it stands. */
	body: () => Record<string, unknown>;
	/** Where the stray key goes: the top of the body unless a nested object is named. */
	into?: string;
}

let w: World;
let proofId = '';
let profileId = '';
let versionId = '';
let game: Awaited<ReturnType<typeof loadGame>>;

beforeAll(async () => {
	w = await openWorld();
	game = await loadGame(w.db, w.gameId);
	const owner = w.callers.owner!;
	proofId = (await cutProof(w.db, actorIn(w, 'owner'), { description: 'Strict bodies' })).id;
	profileId = (await saveProfile(w.db, actorIn(w, 'owner'), { ...DEFAULT_PROFILE, name: 'Strict shop' })).id;
	versionId = (await historyOf(w.db, w.gameId, { collection: 'runner', objectId: game.runners[0].id, limit: 1 }))[0].id;
});
afterAll(async () => w?.close());

const gameP = () => ({ gameId: w.gameId });
const teamP = () => ({ teamId: w.teamId });
const proofP = () => ({ gameId: w.gameId, proofId });
const latest = async () => (game = await loadGame(w.db, w.gameId));
const scenario = { finish: 12, stacks: [{ space: 0, bottomToTop: ['a', 'b'] }], deck: [{ runner: 'a', steps: 1 }, { runner: 'b', steps: 2 }] };
const objectRoute = 'games/[gameId=id]/[collection=collection]/[objectId]/+server.ts';
const collectionRoute = 'games/[gameId=id]/[collection=collection]/+server.ts';

const ROWS: Row[] = [
	{ file: 'teams/+server.ts', method: 'POST', who: 'owner', params: () => ({}), body: () => ({ name: 'Strict team' }) },
	{ file: 'teams/[teamId=id]/games/+server.ts', method: 'POST', who: 'owner', params: teamP, body: () => ({ name: 'Strict game' }) },
	{ file: 'teams/[teamId=id]/invitations/+server.ts', method: 'POST', who: 'owner', params: teamP, body: () => ({ email: 'strict@invite.test', role: 'reviewer' }) },
	{
		file: 'teams/[teamId=id]/members/[userId=id]/+server.ts',
		method: 'PATCH',
		who: 'owner',
		params: () => ({ teamId: w.teamId, userId: w.callers.reviewer!.id }),
		body: () => ({ role: 'reviewer' })
	},
	{ file: 'teams/[teamId=id]/printer-profiles/+server.ts', method: 'POST', who: 'owner', params: teamP, body: () => ({ ...DEFAULT_PROFILE, name: 'Strict new shop' }) },
	{
		file: 'teams/[teamId=id]/printer-profiles/[profileId=id]/+server.ts',
		method: 'PUT',
		who: 'owner',
		params: () => ({ teamId: w.teamId, profileId }),
		body: () => ({ ...DEFAULT_PROFILE, name: 'Strict shop', version: 1 })
	},
	// The confirmation names another game, so even an accepted body would delete nothing.
	{ file: 'games/[gameId=id]/+server.ts', method: 'DELETE', who: 'owner', params: gameP, body: () => ({ confirm: 'Not this game' }) },
	{ file: 'games/[gameId=id]/mute/+server.ts', method: 'PUT', who: 'owner', params: gameP, body: () => ({ muted: true }) },
	{ file: 'games/[gameId=id]/settings/+server.ts', method: 'PUT', who: 'owner', params: gameP, body: () => ({ version: game.rogueRunner?.version ?? 0 }) },
	{ file: 'games/[gameId=id]/preview/+server.ts', method: 'POST', who: 'owner', params: gameP, body: () => ({ kind: game.kinds[0], side: 'front' }) },
	{ file: 'games/[gameId=id]/preview/+server.ts', method: 'POST', who: 'owner', params: gameP, body: () => ({ kind: game.kinds[0], side: 'front' }), into: 'kind' },
	{ file: 'games/[gameId=id]/print-jobs/+server.ts', method: 'POST', who: 'owner', params: gameP, body: () => ({ kind: 'sheets', query: {}, proof: 'nonexistent' }) },
	{ file: 'games/[gameId=id]/odds/+server.ts', method: 'POST', who: 'owner', params: gameP, body: () => ({ ...scenario, exact: true }) },
	{ file: 'games/[gameId=id]/odds/+server.ts', method: 'POST', who: 'owner', params: gameP, body: () => ({ race: { players: 3 }, samples: 10 }) },
	{ file: 'games/[gameId=id]/odds/scenarios/+server.ts', method: 'POST', who: 'owner', params: gameP, body: () => ({ name: 'Strict', scenario }) },
	{
		file: 'games/[gameId=id]/history/[versionId=id]/restore/+server.ts',
		method: 'POST',
		who: 'owner',
		params: () => ({ gameId: w.gameId, versionId }),
		body: () => ({ version: game.runners[0].version })
	},
	{ file: 'games/[gameId=id]/proofs/+server.ts', method: 'POST', who: 'owner', params: gameP, body: () => ({ description: 'Strict proof' }) },
	{
		file: 'games/[gameId=id]/proofs/[proofId]/comments/+server.ts',
		method: 'POST',
		who: 'owner',
		params: proofP,
		body: () => ({ cardId: game.cards[0].id, xMm: 10, yMm: 10, body: 'Strict comment' })
	},
	{ file: 'games/[gameId=id]/proofs/[proofId]/verdicts/+server.ts', method: 'POST', who: 'owner', params: proofP, body: () => ({ verdict: 'approve' }) },
	{ file: 'games/[gameId=id]/proofs/[proofId]/withdraw/+server.ts', method: 'POST', who: 'owner', params: proofP, body: () => ({ note: 'Strict' }) },
	// Every collection, created and saved.
	...(['runners', 'money-tables', 'kinds', 'cards'] as const).map(
		(collection): Row => ({
			file: collectionRoute,
			method: 'POST',
			who: 'owner',
			params: () => ({ gameId: w.gameId, collection }),
			body: () => {
				const source = { runners: game.runners, 'money-tables': game.moneyTables, kinds: game.kinds, cards: game.cards }[collection];
				const { version: _v, ...copy } = source[source.length - 1] as { version?: number; id: string };
				return { ...copy, id: `strict-${collection}` };
			}
		})
	),
	...(['runners', 'money-tables', 'kinds', 'cards', 'art'] as const).map(
		(collection): Row => ({
			file: objectRoute,
			method: 'PUT',
			who: 'owner',
			params: () => {
				const source = { runners: game.runners, 'money-tables': game.moneyTables, kinds: game.kinds, cards: game.cards, art: game.art }[collection];
				return { gameId: w.gameId, collection, objectId: source[0].id };
			},
			body: () => {
				const source = { runners: game.runners, 'money-tables': game.moneyTables, kinds: game.kinds, cards: game.cards, art: game.art }[collection];
				return { ...source[0] };
			}
		})
	)
];

describe('strict JSON bodies', () => {
	it('every JSON write route under /api/v1 has a row here', () => {
		const covered = new Set(ROWS.map((r) => r.file));
		expect(jsonRoutes().filter((f) => !covered.has(f))).toEqual([]);
	});

	for (const row of ROWS) {
		const label = `${row.method} ${row.file}${row.into ? ` (inside ${row.into})` : ''}`;
		it(`${label}: an unknown key → 400 naming it`, async () => {
			await latest();
			const mod = (await import(/* @vite-ignore */ join(API, row.file))) as Record<string, Handler>;
			const body = row.body();
			const target = row.into ? (body[row.into] = { ...(body[row.into] as object) }) : body;
			(target as Record<string, unknown>).bleedMm = -3;
			const before = await loadGame(w.db, w.gameId);
			const res = await mod[row.method](fakeEvent(w.callers[row.who], { method: row.method, params: row.params(), json: body }) as never);
			const answer = await res.json();
			expect(res.status, JSON.stringify(answer)).toBe(400);
			expect(answer.error.message).toContain('bleedMm');
			// Nothing stored: the game is as it was.
			expect((await loadGame(w.db, w.gameId)).version).toBe(before.version);
		});
	}

	it('the same card-kind save without the stray key is accepted', async () => {
		const mod = (await import(/* @vite-ignore */ join(API, objectRoute))) as Record<string, Handler>;
		const kind = (await latest()).kinds[0];
		const res = await mod.PUT(fakeEvent(w.callers.owner, { method: 'PUT', params: { gameId: w.gameId, collection: 'kinds', objectId: kind.id }, json: kind }) as never);
		expect(res.status).toBe(200);
	});
});
