/** Rows of the role × route table: the pixel difference of a card between two proofs. */
import type { Row } from '../role-table';
import { as, g, readers } from '../role-table';
import { statusOf, type World, actorIn } from '../harness';
import { cutProof, snapshotOf } from '$lib/server/proofs';
import * as diffApi from '../../../src/routes/api/v1/games/[gameId=id]/proofs/compare/diff.png/+server';

const cut = (w: World) => cutProof(w.db, actorIn(w, 'designer'), { description: 'compare rows' });

export const rows: Row[] = [
	{
		route: 'GET /api/v1/games/{gameId}/proofs/compare/diff.png (unreleased)',
		run: async (w, who) => {
			const a = await cut(w);
			const b = await cut(w);
			const card = snapshotOf(b).cards[0].id;
			return statusOf(() => diffApi.GET(as(w, who, { params: g(w), path: `/?a=${a.id}&b=${b.id}&card=${card}&side=front` })));
		},
		expect: { ...readers, printer: 404, default: 200 }
	}
];
