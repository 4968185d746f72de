/** Rows of the role × route table: the proof pages (list, viewer, release page, comparison) and the activity log. */
import type { Row } from '../role-table';
import { as, g, readers, members } from '../role-table';
import { statusOf, type World, actorIn } from '../harness';
import { cutProof, releaseProof, withdrawProof } from '$lib/server/proofs';
import * as proofsPage from '../../../src/routes/(app)/games/[gameId=id]/proofs/+page.server';
import * as proofPage from '../../../src/routes/(app)/games/[gameId=id]/proofs/[number]/+page.server';
import * as comparePage from '../../../src/routes/(app)/games/[gameId=id]/proofs/compare/+page.server';
import * as activityPage from '../../../src/routes/(app)/games/[gameId=id]/activity/+page.server';

const designer = (w: World) => ({ id: w.callers.designer!.id, name: w.callers.designer!.name });
const fresh = (w: World) => cutProof(w.db, actorIn(w, 'designer'), { description: 'page table test' });
async function released(w: World) {
	return releaseProof(w.db, actorIn(w, 'designer'), { proof: await fresh(w) });
}

/** Everyone in the team, printers included. */
const team = { default: 200, anonymous: 401, outsider: 404 };
/** Unreleased proofs do not exist for printers. */
const unreleased = { ...readers, printer: 404, default: 200 };

export const rows: Row[] = [
	{ route: 'load /games/{gameId}/proofs', run: (w, who) => statusOf(() => proofsPage.load(as(w, who, { params: g(w) }))), expect: team },
	{
		route: 'load /games/{gameId}/proofs/{number} (unreleased)',
		run: async (w, who) => {
			const p = await fresh(w);
			return statusOf(() => proofPage.load(as(w, who, { params: g(w, { number: String(p.number) }) })));
		},
		expect: unreleased
	},
	{
		route: 'load /games/{gameId}/proofs/{number} (released: the printer gets the release page)',
		run: async (w, who) => {
			const p = await released(w);
			return statusOf(() => proofPage.load(as(w, who, { params: g(w, { number: String(p.number) }) })));
		},
		expect: team
	},
	{
		route: 'load /games/{gameId}/proofs/{number} (withdrawn release: the printer learns it is withdrawn)',
		run: async (w, who) => {
			const p = await withdrawProof(w.db, actorIn(w, 'designer'), { proof: await released(w), note: 'table test' });
			return statusOf(() => proofPage.load(as(w, who, { params: g(w, { number: String(p.number) }) })));
		},
		expect: team
	},
	{
		route: 'load /games/{gameId}/proofs/{number} (no such proof)',
		run: (w, who) => statusOf(() => proofPage.load(as(w, who, { params: g(w, { number: '99999' }) }))),
		expect: { ...members, default: 404 }
	},
	{
		route: 'load /games/{gameId}/proofs/compare',
		run: async (w, who) => {
			const a = await fresh(w);
			const b = await fresh(w);
			return statusOf(() => comparePage.load(as(w, who, { params: g(w), path: `/?a=${a.number}&b=${b.number}` })));
		},
		expect: { ...readers, default: 200 }
	},
	{ route: 'load /games/{gameId}/activity', run: (w, who) => statusOf(() => activityPage.load(as(w, who, { params: g(w) }))), expect: { ...readers, default: 200 } }
];
