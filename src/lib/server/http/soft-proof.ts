/**
 * GET …/cards/{cardId}/soft-proof.png (working game and proofs) and POST …/preview/soft-proof
 * (the editor's unsaved card): a face as it will print, with its figures in the answer.
 */
import type { RequestEvent } from '@sveltejs/kit';
import { readJson } from './api';
import { Invalid } from '../refusals';
import { printSource } from './print-source';
import { cardOf, softProofCard, type CardSoftProof } from '../soft-proof';
import { db } from '../runtime';
import { PreviewSoftProofRequestSchema } from './requests';
import { SoftProofChoiceSchema } from '$lib/schemas/printing';
import type { ApiAnswer, SoftProofSchema } from '$lib/schemas/api';

type Ev = RequestEvent<{ gameId: string; proofId?: string; cardId?: string }>;

function choiceOf(query: URLSearchParams) {
	const parsed = SoftProofChoiceSchema.safeParse(Object.fromEntries(query));
	if (!parsed.success) throw new Invalid( parsed.error.issues.map((i) => i.message).join('; '));
	return parsed.data;
}

const pct = (share: number) => Math.round(share * 10000) / 100;

/** The PNG itself; the figures travel in headers for callers that want them. */
export async function softProofPng(event: Ev) {
	const d = await db();
	const source = await printSource(d, event.locals, event.params.gameId, event.params.proofId);
	const choice = choiceOf(event.url.searchParams);
	const proof = await softProofCard(d, source, cardOf(source, event.params.cardId!), choice);
	return new Response(Buffer.from(proof.png), {
		headers: {
			'content-type': 'image/png',
			'x-paddock-press-condition': proof.conditionIdentifier,
			'x-paddock-delta-e2000-threshold': String(proof.thresholdDeltaE2000),
			'x-paddock-moved-pct': String(pct(proof.movedShare)),
			'x-paddock-max-delta-e2000': proof.maxDeltaE2000.toFixed(1),
			// A proof never changes, but the game's default press profile may: ask again each time.
			'cache-control': 'private, no-cache'
		}
	});
}

export const answerOf = (proof: CardSoftProof): ApiAnswer<typeof SoftProofSchema> => ({
	png: `data:image/png;base64,${Buffer.from(proof.png).toString('base64')}`,
	widthPx: proof.widthPx,
	heightPx: proof.heightPx,
	thresholdDeltaE2000: proof.thresholdDeltaE2000,
	movedPct: pct(proof.movedShare),
	maxDeltaE2000: Math.round(proof.maxDeltaE2000 * 10) / 10,
	profileName: proof.profileName,
	conditionIdentifier: proof.conditionIdentifier
});


/** The editor's card, unsaved, soft-proofed against the saved game. Writes nothing. */
export async function previewSoftProof(event: Ev) {
	const d = await db();
	const source = await printSource(d, event.locals, event.params.gameId);
	const input = await readJson(event.request, PreviewSoftProofRequestSchema);
	if (input.card && input.card.data.type !== input.kind.type) {
		throw new Invalid( `A ${input.kind.type} card kind cannot show ${input.card.data.type} data`);
	}
	const { kind, card, ...choice } = input;
	return answerOf(await softProofCard(d, source, { kind, card }, choice));
}
