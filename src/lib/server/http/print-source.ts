/**
 * What a print request prints: the working game (readers of the game) or exactly a proof's
 * snapshot (printers: released proofs only), with the caller checked once.
 */
import { requireGame, requireGameRole, may } from './guard';
import { requireProof } from './proof-access';
import { snapshotOf } from '../proofs';
import { NotAllowed } from '../refusals';
import type { PrintSource } from '../printing';
import type { Db } from '../db';

/** The working game (readers of the game) or a proof (printers: released proofs only). */
export async function printSource(db: Db, locals: App.Locals, gameId: string, proofKey?: string): Promise<PrintSource> {
	if (proofKey) {
		const { proof, game, actor } = await requireProof(db, locals, gameId, proofKey);
		return {
			game: snapshotOf(proof),
			gameId,
			teamId: game.teamId,
			actor,
			versionLabel: `proof ${proof.number}`,
			proofNumber: proof.number,
			date: proof.createdAt.toISOString().slice(0, 10),
			pressProfileId: game.pressProfileId ?? undefined
		};
	}
	const { role } = await requireGameRole(db, locals, gameId, 'release.read');
	if (!may(role, 'game.read')) throw new NotAllowed('Printers print released proofs; open the proof to download its files');
	const { game, doc, actor } = await requireGame(db, locals, gameId, 'release.read');
	return {
		game: doc,
		gameId,
		teamId: game.teamId,
		actor,
		versionLabel: `working copy v${game.version}`,
		date: new Date().toISOString().slice(0, 10),
		pressProfileId: game.pressProfileId ?? undefined
	};
}

