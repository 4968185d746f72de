/**
 * Finding a proof for a caller: printers see released proofs only (any other is "not found" to
 * them), everyone else in the team sees all; then the action's own permission.
 */
import { requireGameRole, may, type Permission } from './guard';
import { findProof } from '../proofs';
import type { Db } from '../db';
import { isUuid } from '$lib/schemas/ids';
import { NotFound, NotAllowed } from '../refusals';


export async function requireProof(
	db: Db,
	locals: App.Locals,
	gameId: string,
	key: string,
	permission: Permission = 'release.read'
) {
	const { user, role, game, actor } = await requireGameRole(db, locals, gameId, 'release.read');
	const releasedOnly = !may(role, 'game.read');
	const byNumber = /^\d{1,6}$/.test(key);
	if (!byNumber && !isUuid(key)) throw new NotFound('No such proof');
	const proof = await findProof(db, gameId, byNumber ? { number: Number(key) } : { id: key }, releasedOnly);
	if (!may(role, permission)) throw new NotAllowed(`A ${role} may not do this`);
	return { user, role, game, actor, proof };
}
