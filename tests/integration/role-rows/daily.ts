/** Rows of the role × route table: proof art, game deletion and copies, history and restore. */
import type { Row } from '../role-table';
import { as, g, game } from '../role-table';
import { statusOf, type World, actorIn } from '../harness';
import { cutProof, releaseProof } from '$lib/server/proofs';
import * as proofArt from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/art-files/[sha256]/+server';
import * as pressColour from '../../../src/routes/api/v1/press-colour/+server';
import * as runnersPage from '../../../src/routes/(app)/games/[gameId=id]/runners/+page.server';
import * as printPreview from '../../../src/routes/api/v1/games/[gameId=id]/print-preview/+server';

let releasedId: string | undefined;
/** One released proof, made once. */
async function released(w: World) {
	if (releasedId) return releasedId;
	const designer = { id: w.callers.designer!.id, name: w.callers.designer!.name };
	const p = await cutProof(w.db, actorIn(w, 'designer'), { description: 'daily rows' });
	releasedId = (await releaseProof(w.db, actorIn(w, 'designer'), { proof: p })).id;
	return releasedId;
}
const everyone = { default: 200, anonymous: 401, outsider: 404 };

export const rows: Row[] = [
	{
		route: 'GET /api/v1/press-colour?hex=',
		run: (w, who) => statusOf(() => pressColour.GET(as(w, who, { path: '/?hex=%23336699' }))),
		expect: { default: 200, anonymous: 401 }
	},
	{
		route: 'action /games/{gameId}/runners?/delete (a runner in use: 409 with what uses it)',
		run: async (w, who) => {
			const r = (await game(w)).runners[0];
			return statusOf(() => runnersPage.actions.delete(as(w, who, { params: g(w), form: { id: r.id, version: String(r.version) } })));
		},
		expect: { owner: 409, designer: 409, artist: 403, printer: 403, reviewer: 403, anonymous: 401, outsider: 404, default: 403 }
	},
	{
		route: 'GET /api/v1/games/{gameId}/proofs/{proofId}/art-files/{sha256} (released)',
		run: async (w, who) => {
			const proofId = await released(w);
			const art = (await game(w)).art[0];
			return statusOf(() => proofArt.GET(as(w, who, { params: g(w, { proofId, sha256: art.sha256 }) })));
		},
		expect: everyone
	},
	{
		route: 'GET /api/v1/games/{gameId}/print-preview?proof= (released)',
		run: async (w, who) => {
			const proofId = await released(w);
			const kind = (await game(w)).kinds.find((k) => k.type === 'setup')!.id;
			return statusOf(() => printPreview.GET(as(w, who, { params: g(w), path: `/?paper=a4&kinds=${kind}&proof=${proofId}` })));
		},
		expect: everyone
	}
];
