/**
 * Art files on disk, content-addressed under the data directory (never under static/): each file
 * is stored once, named by its SHA-256, and served only through authorised routes.
 */
import { mkdir, readFile, writeFile, rename, access } from 'node:fs/promises';
import { join } from 'node:path';
import { createHash } from 'node:crypto';
import type { Db } from './db';
import { artFiles } from './db/schema';
import { config } from './config';

export const sha256Of = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

let artRoot = join(config.dataDir, 'art');

/** Tests keep their files in a directory of their own. */
export function useArtRoot(dir: string) {
	artRoot = dir;
}

const pathOf = (sha256: string, suffix = '') => join(artRoot, sha256.slice(0, 2), sha256 + suffix);

async function writeOnce(path: string, bytes: Uint8Array) {
	try {
		await access(path);
		return;
	} catch {
		/* not there yet */
	}
	await mkdir(join(path, '..'), { recursive: true });
	const temp = `${path}.${process.pid}.tmp`;
	await writeFile(temp, bytes);
	await rename(temp, path);
}

export async function storeArtFile(
	db: Db,
	bytes: Uint8Array,
	meta: { mime: string; widthPx: number; heightPx: number; dpiX?: number; dpiY?: number },
	thumbnail?: Uint8Array
): Promise<string> {
	const sha256 = sha256Of(bytes);
	await writeOnce(pathOf(sha256), bytes);
	if (thumbnail) await writeOnce(pathOf(sha256, '.thumb.png'), thumbnail);
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

export async function readArtFile(sha256: string): Promise<Uint8Array> {
	if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error('Not an art file name');
	return new Uint8Array(await readFile(pathOf(sha256)));
}

/** The thumbnail when one was made, else the file itself. */
export async function readArtThumbnail(sha256: string): Promise<{ bytes: Uint8Array; mime?: string }> {
	try {
		return { bytes: new Uint8Array(await readFile(pathOf(sha256, '.thumb.png'))), mime: 'image/png' };
	} catch {
		return { bytes: await readArtFile(sha256) };
	}
}
