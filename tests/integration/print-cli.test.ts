/**
 * The print CLI as users run it: the compiled build/print.js (started from its V8 code cache)
 * writes the same sheets on a first run (empty cache directory) and a repeat run (cache filled),
 * read by poppler (pdfinfo -box, pdftotext) and checked by qpdf; its help names the cache.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildPrint } from '../../scripts/build-print.js';
import { pdfinfoBoxes, pdftotext, qpdfCheck } from '../../src/lib/print/testing/poppler';

const root = new URL('../..', import.meta.url).pathname;
let dir: string;
beforeAll(async () => {
	await buildPrint({ quiet: true });
	dir = mkdtempSync(join(tmpdir(), 'paddock-cli-'));
}, 300_000);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const cli = (...args: string[]) => execFileSync(process.execPath, ['build/print.js', ...args], { cwd: root, encoding: 'utf8', timeout: 280_000 });

describe('npm run print', () => {
	it('help names the cache directory and how to turn it off', () => {
		const help = cli('--help');
		expect(help).toContain('--cache DIR');
		expect(help).toContain('--no-cache');
		expect(help).toContain('safe to delete');
	});

	it('a repeat run from the filled cache writes the same sheets as the first', () => {
		const cache = join(dir, 'cache');
		const args = ['--demo', '--paper', 'a4', '--duplex', 'long', '--kinds', 'kd-movement,kd-hazard', '--cache', cache];
		cli(...args, '--out', join(dir, 'first.pdf'));
		const entries = readdirSync(cache).length;
		expect(entries).toBeGreaterThan(0);
		cli(...args, '--out', join(dir, 'repeat.pdf'));
		// Nothing new to keep.
		expect(readdirSync(cache).length).toBe(entries);
		const [first, repeat] = [readFileSync(join(dir, 'first.pdf')), readFileSync(join(dir, 'repeat.pdf'))].map((b) => new Uint8Array(b));
		qpdfCheck(repeat);
		expect(pdfinfoBoxes(repeat)).toEqual(pdfinfoBoxes(first));
		expect(pdftotext(repeat)).toBe(pdftotext(first));
	}, 300_000);
});
