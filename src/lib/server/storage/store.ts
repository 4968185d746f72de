/** The storage interface and its errors (the backends implement it). */
import type { Readable } from 'node:stream';

export interface StoredFile {
	body: Readable;
	bytes: number;
}

export interface Storage {
	/** Where the files are, for messages (never carries a secret). */
	readonly name: string;
	/** Writes `bytes` under `key` unless something is there already (keys name their content). */
	putOnce: (key: string, bytes: Uint8Array, contentType?: string) => Promise<void>;
	/** The whole file; throws StorageMissingError when there is none. */
	get: (key: string) => Promise<Uint8Array>;
	/** The file as a stream, for downloads. */
	open: (key: string) => Promise<StoredFile>;
	has: (key: string) => Promise<boolean>;
	/** Keys under a prefix (tests and housekeeping). */
	list: (prefix: string) => Promise<string[]>;
	/** Deletes the file under `key`; nothing there is no error (housekeeping of finished job files). */
	remove: (key: string) => Promise<void>;
	/** Throws StorageUnavailableError when the store does not answer (readiness). */
	ping: () => Promise<void>;
}

export class StorageMissingError extends Error {}

/** The store cannot be reached: the request should be answered 503 and may be tried again. */
export class StorageUnavailableError extends Error {}

