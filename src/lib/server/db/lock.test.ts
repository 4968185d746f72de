import { describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { mkdtempSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { lockDataDir, DataDirLockedError } from './lock';

describe('data directory lock', () => {
	it('refuses a second holder while the first lives, with a message naming the directory', async () => {
		const dir = mkdtempSync(join(tmpdir(), 'paddock-lock-'));
		// Another process holds the lock: write its pid the way lockDataDir does.
		const other = spawn(process.execPath, ['-e', 'setTimeout(() => {}, 30000)']);
		writeFileSync(join(dir, 'paddock.lock'), String(other.pid));
		try {
			expect(() => lockDataDir(dir)).toThrow(DataDirLockedError);
			expect(() => lockDataDir(dir)).toThrow(new RegExp(`${dir}.*in use by another Paddock process`));
		} finally {
			other.kill();
			await new Promise((r) => other.once('exit', r));
		}
		// The holder is gone: its lock is stale and is taken over.
		const release = lockDataDir(dir);
		expect(() => lockDataDir(dir)).toThrow(DataDirLockedError);
		release();
		expect(existsSync(join(dir, 'paddock.lock'))).toBe(false);
	});
});
