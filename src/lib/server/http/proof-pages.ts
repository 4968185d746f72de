/**
 * What the proof pages share on the server: finding a proof for the caller as a page (refusals
 * become the page's 403 or 404) and the face box of each of its cards, in mm, from the snapshot.
 */
import { requireProof } from './proof-access';
import type { Permission } from './guard';
import type { Db } from '$lib/server/db';
import { bleedMm, safeMm, type Game } from '$lib/game/model';
import type { ProofCard } from '$lib/schemas/proofs';
import { refusedPage } from './answers';
import { cardSummary } from '$lib/game/card-rows';
import { compareGames, type ProofComparison } from '$lib/game/compare';
import type { CardChangeMark } from '$lib/components/proofs/types';

export async function proofForPage(db: Db, locals: App.Locals, gameId: string, key: string, permission: Permission = 'release.read') {
	try {
		return await requireProof(db, locals, gameId, key, permission);
	} catch (e) {
		refusedPage(e);
	}
}

/** Each card with its face box: trim plus bleed on every side, the box face.svg draws in mm. */
export function cardsOf(game: Game): ProofCard[] {
	const kinds = new Map(game.kinds.map((k) => [k.id, k]));
	const ctx = { runners: game.runners, rogue: game.rogueRunner, moneyTables: game.moneyTables };
	return game.cards.flatMap((c) => {
		const kind = kinds.get(c.kindId);
		if (!kind) return [];
		const bleed = bleedMm(kind.bleed);
		return [
			{
				id: c.id,
				name: c.name,
				kindId: kind.id,
				kindName: kind.name,
				summary: cardSummary(c, kind, ctx),
				copies: c.copies,
				trimWidthMm: kind.size.widthMm,
				trimHeightMm: kind.size.heightMm,
				bleedMm: bleed,
				safeMm: safeMm(kind.bleed),
				widthMm: kind.size.widthMm + 2 * bleed,
				heightMm: kind.size.heightMm + 2 * bleed
			}
		];
	});
}

export const kindsOf = (cards: ProofCard[]) => [...new Map(cards.map((c) => [c.kindId, { id: c.kindId, name: c.kindName }])).values()];

/** Per card, how it differs from the same card in an earlier snapshot: new, or which fields changed. */
export function changesSince(before: Game, after: Game): Record<string, CardChangeMark> {
	const comparison: ProofComparison = compareGames(before, after);
	return Object.fromEntries([
		...comparison.added.map((a) => [a.cardId, { status: 'added', parts: [], fields: [] }] as const),
		...comparison.changed.map((c) => [c.cardId, { status: 'changed', parts: c.parts, fields: c.fields }] as const)
	]);
}
