/**
 * Rendered faces kept for the app's face routes (SVG text, art and fonts left out), by the hash
 * of everything a face is drawn from (../print/cache.ts `faceScope`: the card, its kind, runner,
 * money table and art, the engine and its layouts) plus how it is drawn (side, guides). One LRU
 * bounded by bytes (lru-cache), so a busy server never grows past it.
 *
 * A second, small map goes from "this card of this game at this game version" to that hash:
 * every write of a game's content bumps `games.version`, so a repeat request for an unchanged
 * game answers without reading the game at all.
 */
import { LRUCache } from 'lru-cache';
import { ENGINE_SALT, faceScope, hashOf } from '$lib/print/cache';
import type { Card, CardKind, Game } from '$lib/game/model';
import type { FaceTemplate } from './faces';

/**
 * Rendered faces, kept without their art and fonts (./faces.ts `FaceTemplate`), which
 * each answer fills in: some KB a face, so this holds a few thousand.
 */
export const FACE_CACHE_BYTES = 12 * 1024 * 1024;

export interface KeptFace extends FaceTemplate {
	warnings: number;
}

/** JavaScript strings take up to two bytes a character; the rest is the entry's own bookkeeping (a rough figure). */
const ENTRY_OVERHEAD_BYTES = 64;
/** One art file named by a face: its hash and type (a rough figure too). */
const ART_ENTRY_BYTES = 200;

const faces = new LRUCache<string, KeptFace>({
	maxSize: FACE_CACHE_BYTES,
	sizeCalculation: (f) => f.svg.length * 2 + f.art.length * ART_ENTRY_BYTES + ENTRY_OVERHEAD_BYTES
});

/** Room for the (game, version, card, side, variant) → content key map: some tens of thousands of keys. */
export const KEY_CACHE_BYTES = 4 * 1024 * 1024;

const byVersion = new LRUCache<string, string>({
	maxSize: KEY_CACHE_BYTES,
	sizeCalculation: (contentKey, versionKey) => (versionKey.length + contentKey.length) * 2 + ENTRY_OVERHEAD_BYTES
});

/** The content key of one face drawn one way (`variant`: guides, resolution, format). */
export function faceContentKey(game: Game, kind: CardKind, card: Card | undefined, side: 'front' | 'back', variant: string): string {
	return hashOf([ENGINE_SALT, faceScope(game, kind, card, side), variant]);
}

export function keptFace(key: string): KeptFace | undefined {
	return faces.get(key);
}

export function keepFace(key: string, face: KeptFace): KeptFace {
	faces.set(key, face);
	return face;
}

/** The content key of a face of an unchanged game, if it was drawn before at this version. */
export function knownKey(versionKey: string): string | undefined {
	return byVersion.get(versionKey);
}

export function rememberKey(versionKey: string, contentKey: string): void {
	byVersion.set(versionKey, contentKey);
}

/** What the cache holds now (for the benchmark). */
export function faceCacheStats() {
	return {
		entries: faces.size,
		bytes: faces.calculatedSize,
		maxBytes: FACE_CACHE_BYTES,
		keys: { entries: byVersion.size, bytes: byVersion.calculatedSize, maxBytes: KEY_CACHE_BYTES }
	};
}

/** An ETag from a content key (RFC 9110 §8.8.3: a quoted opaque string). */
export const etagOf = (key: string) => `"${key.slice(0, 32)}"`;

/** Whether the request's If-None-Match names this ETag (RFC 9110 §13.1.2: weak comparison). */
export function notModified(request: Request, etag: string): boolean {
	const header = request.headers.get('if-none-match');
	if (!header) return false;
	if (header.trim() === '*') return true;
	return header.split(',').some((t) => t.trim().replace(/^W\//, '') === etag);
}
