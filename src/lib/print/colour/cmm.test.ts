/**
 * Our conversions against LittleCMS's own command-line tool (`transicc`, Debian's liblcms2-utils),
 * run on the same profile: the wasm build in the app must give the CMYK the reference tool gives,
 * within 1 % of each ink.
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { PressColour, profileKey } from './cmm';
import { checkPressProfile, IccError, readIccHeader } from './icc';
import { BUILTIN_PRESS_PROFILE_FILE } from './press-profiles';

const profilePath = resolve(BUILTIN_PRESS_PROFILE_FILE);
const icc = new Uint8Array(readFileSync(profilePath));

/** A handful of sRGB colours: primaries, a card green, skin, greys, paper white and black. */
const SAMPLES: [number, number, number][] = [
	[255, 0, 0],
	[0, 128, 0],
	[46, 160, 67],
	[20, 40, 200],
	[0, 255, 255],
	[230, 180, 150],
	[128, 128, 128],
	[255, 255, 255],
	[0, 0, 0]
];

/** transicc: `-i *sRGB` (its built-in sRGB), `-o` our profile, `-t` intent, `-b` black-point compensation, `-n` no prompts. */
function transicc(intent: 0 | 1, bpc: boolean): number[][] {
	const args = ['-i', '*sRGB', '-o', profilePath, '-t', String(intent), ...(bpc ? ['-b'] : []), '-n'];
	const out = execFileSync('transicc', args, { input: SAMPLES.map((s) => s.join(' ')).join('\n') + '\n', encoding: 'utf8' });
	return out
		.trim()
		.split('\n')
		.filter((l) => /^[\d.\s-]+$/.test(l.trim()))
		.map((l) => l.trim().split(/\s+/).map(Number));
}

describe('press colour through LittleCMS', () => {
	it('reads the shipped profile as a CMYK output profile (ICC.1:2010 §7.2 header)', () => {
		const h = checkPressProfile(icc);
		expect(h).toMatchObject({ signature: 'acsp', deviceClass: 'prtr', colourSpace: 'CMYK', pcs: 'Lab ', sizeBytes: icc.length });
	});

	it('refuses what is not a CMYK output profile', () => {
		expect(() => readIccHeader(new Uint8Array(200))).toThrow(IccError);
		const display = icc.slice();
		display.set([...'mntr'].map((c) => c.charCodeAt(0)), 12);
		expect(() => checkPressProfile(display)).toThrow(/display profile/);
		const rgb = icc.slice();
		rgb.set([...'RGB '].map((c) => c.charCodeAt(0)), 16);
		expect(() => checkPressProfile(rgb)).toThrow(/for RGB data/);
		expect(() => checkPressProfile(icc.subarray(0, icc.length - 10))).toThrow(/cut short/);
	});

	for (const [intent, name, bpc] of [
		[1, 'relative' as const, true],
		[0, 'perceptual' as const, false]
	] as const) {
		it(`${name}: our CMYK equals transicc's within 1 %`, async () => {
			const press = await PressColour.open(icc, name);
			const theirs = transicc(intent, bpc);
			expect(theirs).toHaveLength(SAMPLES.length);
			SAMPLES.forEach((rgb, i) => {
				const hex = '#' + rgb.map((v) => v.toString(16).padStart(2, '0')).join('');
				const ours = press.cmykOf(hex).map((v) => v * 100);
				for (let c = 0; c < 4; c++) expect(Math.abs(ours[c] - theirs[i][c]), `${hex} ink ${c}: ${ours} vs ${theirs[i]}`).toBeLessThanOrEqual(1);
				// 8-bit pixels go through the same transform (rounded to 1/255 of each ink).
				const px = press.pixelsToCmyk(new Uint8Array(rgb));
				for (let c = 0; c < 4; c++) expect(Math.abs((px[c] / 255) * 100 - theirs[i][c])).toBeLessThanOrEqual(1);
			});
		});
	}

	it('keeps one converter per profile and intent', async () => {
		const a = await PressColour.open(icc, 'relative');
		expect(await PressColour.open(icc, 'relative')).toBe(a);
		expect(a.profileKey).toBe(profileKey(icc));
		expect(a.description).toContain('FOGRA39');
	});

	it('soft proof: a saturated screen green falls outside the press gamut, a mid grey does not', async () => {
		const press = await PressColour.open(icc, 'relative');
		const { deltaE2000, rgb } = press.softProof(new Uint8Array([0, 255, 0, 128, 128, 128]));
		expect(deltaE2000[0]).toBeGreaterThan(10);
		expect(deltaE2000[1]).toBeLessThan(1);
		// Printed, the green is duller: less green relative to the others than on screen.
		expect(rgb[1] - Math.max(rgb[0], rgb[2])).toBeLessThan(255);
	});
});
