/**
 * Art files, content-addressed in the file store (the data directory or a bucket, never under
 * static/): each file is stored once, named by its SHA-256, and served only through authorised routes.
 */
import { createHash } from 'node:crypto';
import { LRUCache } from 'lru-cache';
import type { Db } from './db';
import { artFiles } from './db/schema';
import { storage, artKey, StorageMissingError, type StoredFile } from './storage';
import type { InspectedArt } from '$lib/art/inspect';

export const sha256Of = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

const checked = (sha256: string) => {
	if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error('Not an art file name');
	return sha256;
};

/**
 * Stores art that `inspectArt` passed, with its thumbnail. It takes nothing else, so every path
 * that stores a file (upload, replace, bundle import, the demo seed) has run the same inspection.
 */
export async function storeArtFile(db: Db, inspected: InspectedArt): Promise<string> {
	const { bytes, thumbnail: thumb, ...meta } = inspected;
	const thumbnail = thumb.bytes;
	const sha256 = sha256Of(bytes);
	// Files first, the row last: a row never points at a file that is not there.
	await storage().putOnce(artKey(sha256), bytes, meta.mime);
	if (thumbnail) await storage().putOnce(artKey(sha256, '.thumb.png'), thumbnail, 'image/png');
	await db
		.insert(artFiles)
		.values({
			sha256,
			mime: meta.mime,
			bytes: bytes.byteLength,
			widthPx: meta.widthPx,
			heightPx: meta.heightPx,
			dpiX: meta.dpiX ? Math.round(meta.dpiX) : null,
			dpiY: meta.dpiY ? Math.round(meta.dpiY) : null
		})
		.onConflictDoNothing();
	return sha256;
}

/**
 * Art read lately, by hash, bounded by bytes (lru-cache): every print job, face and export of a
 * game reads the same files again. A file never changes under its name, so nothing kept goes stale.
 */
export const ART_CACHE_BYTES = 48 * 1024 * 1024;
const recentArt = new LRUCache<string, Uint8Array>({
	maxSize: ART_CACHE_BYTES,
	sizeCalculation: (bytes) => Math.max(1, bytes.byteLength),
	// One huge scan must not empty the cache of everything else.
	maxEntrySize: ART_CACHE_BYTES / 4
});

/** What the art cache holds now (for the benchmark). */
export const artCacheStats = () => ({ entries: recentArt.size, bytes: recentArt.calculatedSize, maxBytes: ART_CACHE_BYTES });

/** The art file's bytes; shared with other readers, so never written to. */
export async function readArtFile(sha256: string): Promise<Uint8Array> {
	const kept = recentArt.get(checked(sha256));
	if (kept) return kept;
	const bytes = await storage().get(artKey(sha256));
	recentArt.set(sha256, bytes);
	return bytes;
}

/** The file as a stream (downloads), with the thumbnail instead when asked and one was made. */
export async function openArtFile(sha256: string, thumbnail = false): Promise<StoredFile & { thumbnail: boolean }> {
	if (thumbnail) {
		try {
			return { ...(await storage().open(artKey(checked(sha256), '.thumb.png'))), thumbnail: true };
		} catch (e) {
			if (!(e instanceof StorageMissingError)) throw e;
		}
	}
	return { ...(await storage().open(artKey(checked(sha256)))), thumbnail: false };
}
