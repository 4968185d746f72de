/** Rows of the role × route table: accounts, teams, members, the team and game pages. */
import { randomUUID } from 'node:crypto';
import type { Row } from '../role-table';
import { as, signedIn, members, onlyOwner, editors } from '../role-table';
import { fakeEvent } from '../harness';
import { createUser } from '$lib/server/users';
import { memberships } from '$lib/server/db/schema';
import * as me from '../../../src/routes/api/v1/me/+server';
import * as teamsApi from '../../../src/routes/api/v1/teams/+server';
import * as gamesApi from '../../../src/routes/api/v1/teams/[teamId=id]/games/+server';
import * as membersApi from '../../../src/routes/api/v1/teams/[teamId=id]/members/+server';
import * as memberApi from '../../../src/routes/api/v1/teams/[teamId=id]/members/[userId=id]/+server';
import * as invitationsApi from '../../../src/routes/api/v1/teams/[teamId=id]/invitations/+server';
import * as fallbackApi from '../../../src/routes/api/[...rest]/+server';
import * as teamPage from '../../../src/routes/(app)/teams/[teamId=id]/+page.server';
import * as membersPage from '../../../src/routes/(app)/teams/[teamId=id]/members/+page.server';
import * as newTeamPage from '../../../src/routes/(app)/teams/new/+page.server';
import * as gamePage from '../../../src/routes/(app)/games/[gameId=id]/+page.server';
import * as accountPage from '../../../src/routes/(app)/account/+page.server';
import * as mailPage from '../../../src/routes/(app)/mail/+page.server';
import { statusOf } from '../harness';

void fakeEvent;

export const rows: Row[] = [
	{ route: 'GET /api/v1/me', run: (w, who) => statusOf(() => me.GET(as(w, who))), expect: { default: 200, ...signedIn } },
	{ route: 'GET /api/v1/teams', run: (w, who) => statusOf(() => teamsApi.GET(as(w, who))), expect: { default: 200, ...signedIn } },
	{
		route: 'GET /api/v1/teams/{teamId}/games',
		run: (w, who) => statusOf(() => gamesApi.GET(as(w, who, { params: { teamId: w.teamId } }))),
		expect: { default: 200, ...members }
	},
	{
		route: 'POST /api/v1/teams/{teamId}/games',
		run: (w, who) =>
			statusOf(() => gamesApi.POST(as(w, who, { params: { teamId: w.teamId }, json: { name: `Game by ${who}` } }))),
		expect: { default: 403, owner: 201, designer: 201, ...members }
	},
	{
		route: 'GET /api/v1/teams/{teamId}/members',
		run: (w, who) => statusOf(() => membersApi.GET(as(w, who, { params: { teamId: w.teamId } }))),
		expect: { default: 200, ...members }
	},
	{
		route: 'POST /api/v1/teams/{teamId}/invitations',
		run: (w, who) =>
			statusOf(() =>
				invitationsApi.POST(
					as(w, who, { params: { teamId: w.teamId }, json: { email: `new-${who}-${randomUUID()}@x.test`, role: 'artist' } })
				)
			),
		expect: { ...onlyOwner, owner: 201, default: 403 }
	},
	{
		route: 'PATCH /api/v1/teams/{teamId}/members/{userId}',
		run: (w, who) =>
			statusOf(() =>
				memberApi.PATCH(
					as(w, who, { method: 'PATCH', params: { teamId: w.teamId, userId: w.callers.reviewer!.id }, json: { role: 'reviewer' } })
				)
			),
		expect: { ...onlyOwner, default: 403 }
	},
	{
		route: 'DELETE /api/v1/teams/{teamId}/members/{userId}',
		run: async (w, who) => {
			const temp = await createUser(w.db, { email: `temp-${randomUUID()}@x.test`, name: 'Temp', password: 'temporary-pass-1' });
			await w.db.insert(memberships).values({ teamId: w.teamId, userId: temp.id, role: 'reviewer' });
			return statusOf(() => memberApi.DELETE(as(w, who, { method: 'DELETE', params: { teamId: w.teamId, userId: temp.id } })));
		},
		expect: { ...onlyOwner, default: 403 }
	},
	{ route: 'GET /api/v1/unknown', run: (w, who) => statusOf(async () => fallbackApi.GET()), expect: { default: 404 } },
	{
		route: 'load /teams/{teamId}',
		run: (w, who) => statusOf(() => teamPage.load(as(w, who, { params: { teamId: w.teamId } }))),
		expect: { default: 200, ...members }
	},
	{
		route: 'action /teams/{teamId}?/createGame',
		run: (w, who) =>
			statusOf(() =>
				teamPage.actions.createGame(
					as(w, who, { params: { teamId: w.teamId }, form: { name: `Form game ${who}`, bleedStandard: 'us', defaultCardSize: 'mini' } })
				)
			),
		expect: { ...editors, default: 403 }
	},
	{
		route: 'load /teams/{teamId}/members',
		run: (w, who) => statusOf(() => membersPage.load(as(w, who, { params: { teamId: w.teamId } }))),
		expect: { default: 200, ...members }
	},
	{
		route: 'load /games/{gameId}',
		run: (w, who) => statusOf(() => gamePage.load(as(w, who, { params: { gameId: w.gameId } }))),
		expect: { default: 200, ...members }
	},
	{ route: 'load /account', run: (w, who) => statusOf(() => accountPage.load(as(w, who))), expect: { default: 200, ...signedIn } },
	{
		route: 'action /account?/createToken',
		run: (w, who) => statusOf(() => accountPage.actions.createToken(as(w, who, { form: { name: 'script' } }))),
		expect: { default: 200, ...signedIn }
	},
	{
		route: 'action /account?/revokeToken (someone else’s or unknown id)',
		run: (w, who) => statusOf(() => accountPage.actions.revokeToken(as(w, who, { form: { id: randomUUID() } }))),
		expect: { default: 404, ...signedIn }
	},
	{
		route: 'load /mail',
		run: (w, who) => statusOf(() => mailPage.load(as(w, who))),
		// Everyone signed in reads the caught mail addressed to them, and nobody else's.
		expect: { default: 200, ...signedIn }
	}
];

/** These make every caller the owner of a new team, so the table runs them last. */
export const lastRows: Row[] = [
	{
		route: 'POST /api/v1/teams',
		run: (w, who) => statusOf(() => teamsApi.POST(as(w, who, { json: { name: `Team of ${who}` } }))),
		expect: { default: 201, ...signedIn }
	},
	{
		route: 'action /teams/new',
		run: (w, who) => statusOf(() => newTeamPage.actions.default(as(w, who, { form: { name: `New ${who}` } }))),
		expect: { default: 303, ...signedIn }
	}
];
