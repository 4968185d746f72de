/** Rows of the role × route table: soft proofs of the working game, of a released proof, and of the editor's unsaved card. */
import type { Row } from '../role-table';
import { as, g, game, readers } from '../role-table';
import { statusOf, type World, actorIn } from '../harness';
import { cutProof, releaseProof } from '$lib/server/proofs';
import * as gameSoftProof from '../../../src/routes/api/v1/games/[gameId=id]/cards/[cardId]/soft-proof.png/+server';
import * as proofSoftProof from '../../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/cards/[cardId]/soft-proof.png/+server';
import * as previewSoftProof from '../../../src/routes/api/v1/games/[gameId=id]/preview/soft-proof/+server';

let releasedId: string | undefined;
async function released(w: World) {
	if (releasedId) return releasedId;
	const d = w.callers.designer!;
	const p = await cutProof(w.db, actorIn(w, 'designer'), { description: 'soft proof rows' });
	releasedId = (await releaseProof(w.db, actorIn(w, 'designer'), { proof: p })).id;
	return releasedId;
}
/** The working game is soft-proofed for its readers; printers see releases only. */
const working = { ...readers, default: 200 };
const everyone = { default: 200, anonymous: 401, outsider: 404 };

export const rows: Row[] = [
	{
		route: 'GET /api/v1/games/{gameId}/cards/{cardId}/soft-proof.png',
		run: async (w, who) => {
			const card = (await game(w)).cards[0];
			return statusOf(() => gameSoftProof.GET(as(w, who, { params: g(w, { cardId: card.id }) })));
		},
		expect: working
	},
	{
		route: 'GET /api/v1/games/{gameId}/proofs/{proofId}/cards/{cardId}/soft-proof.png (released)',
		run: async (w, who) => {
			const proofId = await released(w);
			const card = (await game(w)).cards[0];
			return statusOf(() => proofSoftProof.GET(as(w, who, { params: g(w, { proofId, cardId: card.id }) })));
		},
		expect: everyone
	},
	{
		route: 'POST /api/v1/games/{gameId}/preview/soft-proof',
		run: async (w, who) => {
			const gm = await game(w);
			const card = gm.cards[0];
			const kind = gm.kinds.find((k) => k.id === card.kindId)!;
			return statusOf(() => previewSoftProof.POST(as(w, who, { params: g(w), json: { kind, card, side: 'front' } })));
		},
		expect: working
	}
];
