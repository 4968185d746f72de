/**
 * The review loop against an in-memory database: proofs are immutable snapshots, comparisons
 * list exactly the changed cards, bad input is refused and writes nothing, mail reaches the
 * people concerned (caught by the local SMTP server).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count, eq } from 'drizzle-orm';
import { openWorld, fakeEvent, type World, actorIn } from './harness';
import { applyChanges, loadGame } from '$lib/server/game-store';
import { cutProof, releaseProof, withdrawProof, addComment, giveVerdict, snapshotOf, setMuted } from '$lib/server/proofs';
import { Invalid } from '$lib/server/refusals';
import { proofComments, proofVerdicts, proofs, caughtMail } from '$lib/server/db/schema';
import { compareGames } from '$lib/game/compare';
import * as proofFace from '../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/cards/[cardId]/face.svg/+server';
import * as releaseApi from '../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/release/+server';
import * as proofPdf from '../../src/routes/api/v1/games/[gameId=id]/proofs/[proofId]/print.pdf/+server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

const designer = () => ({ id: w.callers.designer!.id, name: w.callers.designer!.name });
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const ev = (who: keyof World['callers'], call: Parameters<typeof fakeEvent>[1]) => fakeEvent(w.callers[who], call) as any;

async function faceText(proofId: string, cardId: string) {
	const res = await proofFace.GET(ev('reviewer', { params: { gameId: w.gameId, proofId, cardId } }));
	expect(res.status).toBe(200);
	return res.text();
}

async function pdfOf(proofId: string) {
	const res = await proofPdf.GET(ev('designer', { params: { gameId: w.gameId, proofId }, path: '/?paper=a4&layout=butted&duplex=long&marks=1' }));
	expect(res.status).toBe(200);
	return new Uint8Array(await res.arrayBuffer());
}

async function mailTo(email: string) {
	await new Promise((r) => setTimeout(r, 200));
	return w.db.select().from(caughtMail).where(eq(caughtMail.to, email));
}

describe('proofs', () => {
	it('freeze the game: later edits change neither the faces of proof 1 nor what it holds', async () => {
		const p1 = await cutProof(w.db, actorIn(w, 'designer'), { description: 'first round' });
		const game = await loadGame(w.db, w.gameId);
		const wager = game.cards.find((c) => c.data.type === 'wager')!;
		const table = game.moneyTables.find((t) => wager.data.type === 'wager' && t.id === wager.data.moneyTableId)!;
		const before = await faceText(p1.id, wager.id);
		const pdfBefore = await pdfOf(p1.id);

		// Edit: one card's name, one money table (which reaches every wager card printing it).
		const movement = game.cards.find((c) => c.data.type === 'movement')!;
		await applyChanges(w.db, actorIn(w, 'designer'), { changes: [
			{ collection: 'card', id: movement.id, baseVersion: movement.version!, object: { ...movement, name: `${movement.name} (new)` } },
			{ collection: 'moneyTable', id: table.id, baseVersion: table.version!, object: { ...table, rows: table.rows.map((r) => ({ ...r, coins: r.coins + 2 })) } }
		], action: 'test' });
		const p2 = await cutProof(w.db, actorIn(w, 'designer'), { description: 'second round' });

		expect(await faceText(p1.id, wager.id)).toBe(before);
		// Byte for byte: the proof's PDF is built from its snapshot, dated by the proof.
		expect(Buffer.compare(Buffer.from(await pdfOf(p1.id)), Buffer.from(pdfBefore))).toBe(0);
		expect(Buffer.compare(Buffer.from(await pdfOf(p2.id)), Buffer.from(pdfBefore))).not.toBe(0);
		expect(await faceText(p2.id, wager.id)).not.toBe(before);

		const diff = compareGames(snapshotOf(p1), snapshotOf(p2));
		const printing = game.cards.filter((c) => c.data.type === 'wager' && c.data.moneyTableId === table.id).map((c) => c.id);
		expect(new Set(diff.changed.map((c) => c.cardId))).toEqual(new Set([movement.id, ...printing]));
		expect(diff.added).toEqual([]);
		expect(diff.removed).toEqual([]);
	});

	it('tell reviewers a proof is ready, printers of a release, and not those who muted the game', async () => {
		await setMuted(w.db, actorIn(w, 'artist'), { muted: true });
		const p = await cutProof(w.db, actorIn(w, 'designer'), { description: 'mail round' });
		const ready = await mailTo('reviewer@paddock.test');
		expect(ready.some((m) => m.subject.includes(`Proof ${p.number}`) && m.text.includes(`/proofs/${p.number}`))).toBe(true);
		await releaseProof(w.db, actorIn(w, 'designer'), { proof: p });
		const printer = await mailTo('printer@paddock.test');
		expect(printer.some((m) => m.subject.includes('released for printing'))).toBe(true);
		await addComment(w.db, actorIn(w, 'reviewer'), { proof: p, comment: { cardId: snapshotOf(p).cards[0].id, side: 'front', xMm: 3, yMm: 3, body: 'Colour is off' } });
		expect((await mailTo('artist@paddock.test')).length).toBe(0);
		expect((await mailTo('designer@paddock.test')).some((m) => m.text.includes('Colour is off'))).toBe(true);
	});
});

describe('bad input writes nothing', () => {
	const rows = async (t: typeof proofComments | typeof proofVerdicts | typeof proofs) => (await w.db.select({ n: count() }).from(t))[0].n;

	it('a pin outside the card, or an empty comment', async () => {
		const p = await cutProof(w.db, actorIn(w, 'designer'), { description: 'pins' });
		const card = snapshotOf(p).cards[0];
		const before = await rows(proofComments);
		await expect(addComment(w.db, actorIn(w, 'designer'), { proof: p, comment: { cardId: card.id, side: 'front', xMm: 500, yMm: 10, body: 'far away' } })).rejects.toThrow(/outside the card/);
		await expect(addComment(w.db, actorIn(w, 'designer'), { proof: p, comment: { cardId: 'no-such-card', side: 'front', xMm: 1, yMm: 1, body: 'x' } })).rejects.toBeInstanceOf(Invalid);
		const { CommentSchema } = await import('$lib/server/proofs');
		expect(CommentSchema.safeParse({ cardId: card.id, xMm: 1, yMm: 1, body: '   ' }).success).toBe(false);
		expect(await rows(proofComments)).toBe(before);
	});

	it('a verdict on a withdrawn proof', async () => {
		const p = await cutProof(w.db, actorIn(w, 'designer'), { description: 'withdrawn' });
		const rel = await releaseProof(w.db, actorIn(w, 'designer'), { proof: p });
		const gone = await withdrawProof(w.db, actorIn(w, 'designer'), { proof: rel, note: 'wrong backs' });
		const before = await rows(proofVerdicts);
		await expect(giveVerdict(w.db, actorIn(w, 'reviewer'), { proof: gone, verdict: 'approve', note: '' })).rejects.toThrow(/withdrawn/);
		expect(await rows(proofVerdicts)).toBe(before);
	});

	it('a release by a non-designer', async () => {
		const p = await cutProof(w.db, actorIn(w, 'designer'), { description: 'not yours' });
		const res = await releaseApi.POST(ev('reviewer', { params: { gameId: w.gameId, proofId: p.id } }));
		expect(res.status).toBe(403);
		const [after] = await w.db.select().from(proofs).where(eq(proofs.id, p.id));
		expect(after.releasedAt).toBeNull();
	});
});
