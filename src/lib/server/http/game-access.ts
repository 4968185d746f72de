/** Shared steps of the game API: who may touch which collection, and reading one object. */
import { requireGameRole } from './guard';
import type { Db } from '../db';
import type { Collection } from '../db/schema';
import { COLLECTION_SEGMENTS, type CollectionSegment } from '$lib/schemas/collections';
import { IdSchema } from '$lib/game/model';
import { NotFound } from '../refusals';

export function collectionOf(segment: string): Collection {
	const c = COLLECTION_SEGMENTS[segment as CollectionSegment];
	if (!c) throw new NotFound('No such collection');
	return c;
}

/** Art is the artists' to change; everything else (the rules) only designers'. */
export const editPermission = (c: Collection | 'settings'): 'art.edit' | 'game.edit' => (c === 'art' ? 'art.edit' : 'game.edit');

export function objectIdParam(value: string): string {
	if (!IdSchema.safeParse(value).success) throw new NotFound('No such object');
	return value;
}

export async function requireGameEdit(db: Db, locals: App.Locals, gameId: string, c: Collection | 'settings') {
	return requireGameRole(db, locals, gameId, editPermission(c));
}
