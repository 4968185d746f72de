/**
 * Where files live: art, thumbnails and built print files, under content-addressed keys
 * (`art/ab/ab12…`, `print/…`). Two backends behind one interface: the data directory (default)
 * and an S3-compatible bucket when PADDOCK_STORAGE_URL is set, so several processes on several
 * machines share the same files. Downloads stream; nothing is ever half-written under a key.
 */
import { Readable } from 'node:stream';
import { config } from '../config';
import { directoryStorage } from './directory';
import { bucketStorage } from './bucket';

export * from './store';
import type { Storage, StoredFile } from './store';

/** Art and thumbnails, as laid out in the data directory from the start. */
export const artKey = (sha256: string, suffix = '') => `art/${sha256.slice(0, 2)}/${sha256}${suffix}`;

/** `s3://[key:secret@]bucket[/prefix]?endpoint=…&region=…`, or the data directory. */
export function storageFor(url: string | null, dataDir: string): Storage {
	return url ? bucketStorage(url) : directoryStorage(dataDir);
}

const slot = globalThis as typeof globalThis & { __paddockStorage?: Storage };

export function storage(): Storage {
	slot.__paddockStorage ??= storageFor(config.storageUrl, config.dataDir);
	return slot.__paddockStorage;
}

/** Tests use a store of their own. */
export function useStorage(s: Storage) {
	slot.__paddockStorage = s;
}

/** A file as a download response body (a web stream, read from the store as it is sent). */
export function streamBody(file: StoredFile): ReadableStream<Uint8Array> {
	return Readable.toWeb(file.body) as ReadableStream<Uint8Array>;
}

