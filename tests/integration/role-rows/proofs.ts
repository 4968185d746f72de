/** Rows of the role × route table: proofs, comments, verdicts, releases. */
import type { Row } from '../role-table';
import { as, g, readers, members } from '../role-table';
import { statusOf, type World, actorIn } from '../harness';
import { cutProof, releaseProof, proofsOf } from '$lib/server/proofs';
import * as proofsApi from '../../../src/routes/api/v1/games/[gameId=id]/proofs/+server';
import * as proofApi from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/+server';
import * as commentsApi from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/comments/+server';
import * as resolveApi from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/comments/[commentId=id]/resolve/+server';
import * as verdictsApi from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/verdicts/+server';
import * as releaseApi from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/release/+server';
import * as withdrawApi from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/withdraw/+server';
import * as proofFace from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/cards/[cardId]/face.svg/+server';
import * as compareApi from '../../../src/routes/api/v1/games/[gameId=id]/proofs/compare/+server';
import * as muteApi from '../../../src/routes/api/v1/games/[gameId=id]/mute/+server';

const designer = (w: World) => ({ id: w.callers.designer!.id, name: w.callers.designer!.name });
/** A fresh unreleased proof, cut by the designer. */
const fresh = (w: World) => cutProof(w.db, actorIn(w, 'designer'), { description: 'table test' });
/** A fresh released proof. */
async function released(w: World) {
	const p = await fresh(w);
	return releaseProof(w.db, actorIn(w, 'designer'), { proof: p });
}
const all = { default: 200, anonymous: 401, outsider: 404 };
/** Unreleased proofs do not exist for printers. */
const unreleased = { ...readers, printer: 404 };
const cutters = { owner: 201, designer: 201, artist: 403, printer: 403, reviewer: 403, ...members };
const commenters = { owner: 201, designer: 201, artist: 201, reviewer: 201, printer: 404, ...members };
const verdict = { owner: 201, reviewer: 201, designer: 403, artist: 403, printer: 404, ...members };
const releasers = { owner: 200, designer: 200, artist: 403, reviewer: 403, printer: 404, ...members };

async function firstCard(w: World) {
	const [p] = await proofsOf(w.db, w.gameId, false);
	return ((p.snapshot as { cards: { id: string }[] }).cards[0]).id;
}

export const rows: Row[] = [
	{ route: 'GET /api/v1/games/{gameId}/proofs', run: (w, who) => statusOf(() => proofsApi.GET(as(w, who, { params: g(w) }))), expect: all },
	{
		route: 'POST /api/v1/games/{gameId}/proofs',
		run: (w, who) => statusOf(() => proofsApi.POST(as(w, who, { params: g(w), json: { description: `cut by ${who}` } }))),
		expect: { ...cutters, default: 403 }
	},
	{
		route: 'GET /api/v1/games/{gameId}/proofs/{proofId} (unreleased)',
		run: async (w, who) => {
			const p = await fresh(w);
			return statusOf(() => proofApi.GET(as(w, who, { params: g(w, { proofId: p.id }) })));
		},
		expect: { ...unreleased, default: 200 }
	},
	{
		route: 'GET /api/v1/games/{gameId}/proofs/{proofId} (released)',
		run: async (w, who) => {
			const p = await released(w);
			return statusOf(() => proofApi.GET(as(w, who, { params: g(w, { proofId: String(p.number) }) })));
		},
		expect: all
	},
	{
		route: 'POST /api/v1/games/{gameId}/proofs/{proofId}/comments',
		run: async (w, who) => {
			const p = await fresh(w);
			const cardId = await firstCard(w);
			return statusOf(() => commentsApi.POST(as(w, who, { params: g(w, { proofId: p.id }), json: { cardId, xMm: 10, yMm: 10, body: `from ${who}` } })));
		},
		expect: { ...commenters, default: 403 }
	},
	{
		route: 'GET /api/v1/games/{gameId}/proofs/{proofId}/comments',
		run: async (w, who) => {
			const p = await fresh(w);
			return statusOf(() => commentsApi.GET(as(w, who, { params: g(w, { proofId: p.id }) })));
		},
		expect: { ...commenters, owner: 200, designer: 200, artist: 200, reviewer: 200, default: 403 }
	},
	{
		route: 'POST /api/v1/games/{gameId}/proofs/{proofId}/comments/{commentId}/resolve',
		run: async (w, who) => {
			const p = await fresh(w);
			const cardId = await firstCard(w);
			const made = await commentsApi.POST(as(w, 'reviewer', { params: g(w, { proofId: p.id }), json: { cardId, xMm: 5, yMm: 5, body: 'please fix' } }));
			const { comment } = await made.json();
			return statusOf(() => resolveApi.POST(as(w, who, { params: g(w, { proofId: p.id, commentId: comment.id }) })));
		},
		expect: { ...commenters, owner: 200, designer: 200, artist: 200, reviewer: 200, default: 403 }
	},
	{
		route: 'POST /api/v1/games/{gameId}/proofs/{proofId}/verdicts',
		run: async (w, who) => {
			const p = await fresh(w);
			return statusOf(() => verdictsApi.POST(as(w, who, { params: g(w, { proofId: p.id }), json: { verdict: 'approve', note: '' } })));
		},
		expect: { ...verdict, default: 403 }
	},
	{
		route: 'POST /api/v1/games/{gameId}/proofs/{proofId}/release',
		run: async (w, who) => {
			const p = await fresh(w);
			return statusOf(() => releaseApi.POST(as(w, who, { params: g(w, { proofId: p.id }) })));
		},
		expect: { ...releasers, default: 403 }
	},
	{
		route: 'POST /api/v1/games/{gameId}/proofs/{proofId}/withdraw',
		run: async (w, who) => {
			const p = await released(w);
			return statusOf(() => withdrawApi.POST(as(w, who, { params: g(w, { proofId: p.id }), json: { note: 'oops' } })));
		},
		// The proof is released, so printers see it, and may not withdraw it.
		expect: { ...releasers, printer: 403, default: 403 }
	},
	{
		route: 'GET /api/v1/games/{gameId}/proofs/{proofId}/cards/{cardId}/face.svg (released)',
		run: async (w, who) => {
			const p = await released(w);
			const cardId = await firstCard(w);
			return statusOf(() => proofFace.GET(as(w, who, { params: g(w, { proofId: p.id, cardId }) })));
		},
		expect: all
	},
	{
		route: 'GET /api/v1/games/{gameId}/proofs/compare',
		run: async (w, who) => {
			const a = await fresh(w);
			const b = await fresh(w);
			return statusOf(() => compareApi.GET(as(w, who, { params: g(w), path: `/?a=${a.number}&b=${b.number}` })));
		},
		expect: { ...unreleased, default: 200 }
	},
	{
		route: 'PUT /api/v1/games/{gameId}/mute',
		run: (w, who) => statusOf(() => muteApi.PUT(as(w, who, { method: 'PUT', params: g(w), json: { muted: false } }))),
		expect: all
	}
];
