/**
 * Files in the data directory: a key is a path under it. A file is written to a temporary name
 * and renamed into place, so a reader never sees half of one.
 */
import { createReadStream } from 'node:fs';
import { access, mkdir, readFile, readdir, rename, stat, unlink, writeFile } from 'node:fs/promises';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { randomBytes } from 'node:crypto';
import { StorageMissingError, StorageUnavailableError, type Storage } from './store';

const missing = (e: unknown) => (e as NodeJS.ErrnoException).code === 'ENOENT';

export function directoryStorage(root: string): Storage {
	const base = resolve(root);
	const pathOf = (key: string) => {
		const path = resolve(base, key);
		if (!path.startsWith(base + sep)) throw new Error(`Not a storage key: ${key}`);
		return path;
	};
	const notFound = (key: string) => new StorageMissingError(`No stored file ${key}`);

	async function walk(dir: string): Promise<string[]> {
		let names: string[];
		try {
			names = await readdir(dir);
		} catch (e) {
			if (missing(e)) return [];
			throw e;
		}
		const out: string[] = [];
		for (const name of names) {
			const path = join(dir, name);
			if ((await stat(path)).isDirectory()) out.push(...(await walk(path)));
			else if (!name.endsWith('.tmp')) out.push(relative(base, path).split(sep).join('/'));
		}
		return out;
	}

	return {
		name: `the data directory (${base})`,
		async putOnce(key, bytes) {
			const path = pathOf(key);
			try {
				await access(path);
				return;
			} catch {
				/* not there yet */
			}
			await mkdir(dirname(path), { recursive: true });
			const temp = `${path}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`;
			try {
				await writeFile(temp, bytes);
				await rename(temp, path);
			} catch (e) {
				await unlink(temp).catch(() => {});
				throw e;
			}
		},
		async get(key) {
			try {
				return new Uint8Array(await readFile(pathOf(key)));
			} catch (e) {
				throw missing(e) ? notFound(key) : e;
			}
		},
		async open(key) {
			const path = pathOf(key);
			try {
				const { size } = await stat(path);
				return { body: createReadStream(path), bytes: size };
			} catch (e) {
				throw missing(e) ? notFound(key) : e;
			}
		},
		async has(key) {
			try {
				await access(pathOf(key));
				return true;
			} catch {
				return false;
			}
		},
		async list(prefix) {
			return (await walk(base)).filter((k) => k.startsWith(prefix)).sort();
		},
		async remove(key) {
			try {
				await unlink(pathOf(key));
			} catch (e) {
				if (!missing(e)) throw e;
			}
		},
		async ping() {
			try {
				await mkdir(base, { recursive: true });
				await access(base);
			} catch (e) {
				throw new StorageUnavailableError(`The data directory ${base} cannot be used: ${(e as Error).message}`);
			}
		}
	};
}
