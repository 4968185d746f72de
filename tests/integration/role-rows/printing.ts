/** Rows of the role × route table: print files, printer profiles, print jobs, calibration. */
import type { Row } from '../role-table';
import { as, g, game, readers, members } from '../role-table';
import { statusOf, type World, actorIn } from '../harness';
import { cutProof, releaseProof } from '$lib/server/proofs';
import { saveProfile } from '$lib/server/printer-profiles';
import { DEFAULT_PROFILE } from '$lib/schemas/printing';
import * as gamePdf from '../../../src/routes/api/v1/games/[gameId=id]/print.pdf/+server';
import * as gameZip from '../../../src/routes/api/v1/games/[gameId=id]/cards.zip/+server';
import * as gamePress from '../../../src/routes/api/v1/games/[gameId=id]/cards/[cardId]/press.pdf/+server';
import * as proofPdf from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/print.pdf/+server';
import * as proofZip from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/cards.zip/+server';
import * as proofPress from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/cards/[cardId]/press.pdf/+server';
import * as calibration from '../../../src/routes/api/v1/print/calibration.pdf/+server';
import * as jobsApi from '../../../src/routes/api/v1/games/[gameId=id]/print-jobs/+server';
import * as profilesApi from '../../../src/routes/api/v1/teams/[teamId=id]/printer-profiles/+server';
import * as profileApi from '../../../src/routes/api/v1/teams/[teamId=id]/printer-profiles/[profileId=id]/+server';

const designer = (w: World) => ({ id: w.callers.designer!.id, name: w.callers.designer!.name });
let releasedId: string | undefined;
/** One released proof, made once (its files are built from the snapshot). */
async function released(w: World) {
	if (releasedId) return releasedId;
	const p = await cutProof(w.db, actorIn(w, 'designer'), { description: 'print rows' });
	releasedId = (await releaseProof(w.db, actorIn(w, 'designer'), { proof: p })).id;
	return releasedId;
}
/** The working game prints for readers; printers are sent to releases. */
const working = { ...readers, default: 200 };
const everyone = { default: 200, anonymous: 401, outsider: 404 };
const profileEditors = { owner: 201, designer: 201, printer: 201, artist: 403, reviewer: 403, ...members };
const small = '/?paper=a4&layout=butted&duplex=none&kinds=';

async function oneKind(w: World) {
	const gm = await game(w);
	return gm.kinds.find((k) => k.type === 'setup')!.id;
}

export const rows: Row[] = [
	{
		route: 'GET /api/v1/games/{gameId}/print.pdf',
		run: async (w, who) => statusOf(async () => gamePdf.GET(as(w, who, { params: g(w), path: small + (await oneKind(w)) }))),
		expect: working
	},
	{
		route: 'GET /api/v1/games/{gameId}/cards/{cardId}/press.pdf',
		run: async (w, who) => {
			const card = (await game(w)).cards[0];
			return statusOf(() => gamePress.GET(as(w, who, { params: g(w, { cardId: card.id }) })));
		},
		expect: working
	},
	{
		route: 'GET /api/v1/games/{gameId}/cards.zip (dpi=72)',
		run: (w, who) => statusOf(() => gameZip.GET(as(w, who, { params: g(w), path: '/?dpi=72' }))),
		expect: working
	},
	{
		route: 'GET /api/v1/games/{gameId}/proofs/{proofId}/print.pdf (released)',
		run: async (w, who) => {
			const proofId = await released(w);
			return statusOf(async () => proofPdf.GET(as(w, who, { params: g(w, { proofId }), path: small + (await oneKind(w)) })));
		},
		expect: everyone
	},
	{
		route: 'GET /api/v1/games/{gameId}/proofs/{proofId}/cards/{cardId}/press.pdf (released)',
		run: async (w, who) => {
			const proofId = await released(w);
			const card = (await game(w)).cards[0];
			return statusOf(() => proofPress.GET(as(w, who, { params: g(w, { proofId, cardId: card.id }) })));
		},
		expect: everyone
	},
	{
		route: 'GET /api/v1/games/{gameId}/proofs/{proofId}/cards.zip (released, dpi=72)',
		run: async (w, who) => {
			const proofId = await released(w);
			return statusOf(() => proofZip.GET(as(w, who, { params: g(w, { proofId }), path: '/?dpi=72' })));
		},
		expect: everyone
	},
	{
		route: 'GET /api/v1/print/calibration.pdf',
		run: (w, who) => statusOf(() => calibration.GET(as(w, who, { path: '/?paper=letter&duplex=short' }))),
		expect: { default: 200, anonymous: 401 }
	},
	{
		route: 'POST /api/v1/games/{gameId}/print-jobs',
		run: async (w, who) =>
			statusOf(async () => jobsApi.POST(as(w, who, { params: g(w), json: { query: { paper: 'a4', kinds: await oneKind(w) } } }))),
		expect: { ...working, owner: 202, designer: 202, artist: 202, reviewer: 202 }
	},
	{
		route: 'GET /api/v1/teams/{teamId}/printer-profiles',
		run: (w, who) => statusOf(() => profilesApi.GET(as(w, who, { params: { teamId: w.teamId } }))),
		expect: { default: 200, ...members }
	},
	{
		route: 'POST /api/v1/teams/{teamId}/printer-profiles',
		run: (w, who) =>
			statusOf(() => profilesApi.POST(as(w, who, { params: { teamId: w.teamId }, json: { ...DEFAULT_PROFILE, name: `Printer of ${who}` } }))),
		expect: { ...profileEditors, default: 403 }
	},
	{
		route: 'PUT /api/v1/teams/{teamId}/printer-profiles/{profileId}',
		run: async (w, who) => {
			const p = await saveProfile(w.db, actorIn(w, 'designer'), { ...DEFAULT_PROFILE, name: 'scratch' });
			return statusOf(() =>
				profileApi.PUT(as(w, who, { method: 'PUT', params: { teamId: w.teamId, profileId: p.id }, json: { ...DEFAULT_PROFILE, name: 'scratch', version: p.version, marginMm: 6 } }))
			);
		},
		expect: { ...profileEditors, owner: 200, designer: 200, printer: 200, default: 403 }
	},
	{
		route: 'DELETE /api/v1/teams/{teamId}/printer-profiles/{profileId} (made by the designer)',
		run: async (w, who) => {
			const p = await saveProfile(w.db, actorIn(w, 'designer'), { ...DEFAULT_PROFILE, name: 'scratch' });
			return statusOf(() => profileApi.DELETE(as(w, who, { method: 'DELETE', params: { teamId: w.teamId, profileId: p.id } })));
		},
		// Intended: printers keep the team's printer profiles (product brief, roles), so a printer may
		// delete any of them, including one another member made. Artists and reviewers may not.
		expect: { ...profileEditors, owner: 200, designer: 200, printer: 200, default: 403 }
	}
];

import * as printersPage from '../../../src/routes/(app)/teams/[teamId=id]/printers/+page.server';
import * as printPage from '../../../src/routes/(app)/games/[gameId=id]/print/+page.server';
import { superformJson } from '../harness';

export const pageRows: Row[] = [
	{
		route: 'load /games/{gameId}/print',
		run: (w, who) => statusOf(() => printPage.load(as(w, who, { params: g(w) }))),
		expect: everyone
	},
	{
		route: 'load /teams/{teamId}/printers',
		run: (w, who) => statusOf(() => printersPage.load(as(w, who, { params: { teamId: w.teamId } }))),
		expect: everyone
	},
	{
		route: 'action /teams/{teamId}/printers?/save',
		run: (w, who) =>
			statusOf(() =>
				printersPage.actions.save(as(w, who, { params: { teamId: w.teamId }, form: superformJson({ ...DEFAULT_PROFILE, name: `Form profile ${who}` }) }))
			),
		expect: { ...profileEditors, owner: 200, designer: 200, printer: 200, default: 403 }
	},
	{
		route: 'action /teams/{teamId}/printers?/delete (unknown profile)',
		run: (w, who) =>
			statusOf(() => printersPage.actions.delete(as(w, who, { params: { teamId: w.teamId }, form: { id: '00000000-0000-4000-8000-000000000000' } }))),
		expect: { ...profileEditors, owner: 404, designer: 404, printer: 404, default: 403 }
	}
];
