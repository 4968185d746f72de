/**
 * One process per data directory: PGlite takes no lock of its own, and a second process on the
 * same directory silently loses data. We take an exclusive lock file holding our pid.
 */
import { openSync, writeSync, closeSync, readFileSync, unlinkSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';

export class DataDirLockedError extends Error {}

function alive(pid: number): boolean {
	try {
		process.kill(pid, 0);
		return true;
	} catch (e) {
		return (e as NodeJS.ErrnoException).code === 'EPERM';
	}
}

/** Takes the lock or throws a clear error; returns the function that releases it. */
export function lockDataDir(dataDir: string): () => void {
	mkdirSync(dataDir, { recursive: true });
	const file = join(dataDir, 'paddock.lock');
	for (let attempt = 0; attempt < 2; attempt++) {
		try {
			const fd = openSync(file, 'wx');
			writeSync(fd, String(process.pid));
			closeSync(fd);
			let released = false;
			return () => {
				if (released) return;
				released = true;
				try {
					unlinkSync(file);
				} catch {
					/* already gone */
				}
			};
		} catch (e) {
			if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
			const pid = Number(readFileSync(file, 'utf8').trim());
			if (pid && alive(pid)) {
				throw new DataDirLockedError(
					`The data directory ${dataDir} is in use by another Paddock process (pid ${pid}). ` +
						`Stop that process first, or set PADDOCK_DATA_DIR to another directory.`
				);
			}
			// A lock left by a process that no longer runs: take it over.
			unlinkSync(file);
		}
	}
	throw new DataDirLockedError(`Could not lock the data directory ${dataDir}.`);
}
