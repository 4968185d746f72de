/**
 * The soft proof's figures against LittleCMS's own command-line tool (`transicc`, Debian's
 * liblcms2-utils) on the same profile: the art's Lab, the press's CMYK and the printed Lab come
 * from transicc, the difference from the CIEDE2000 checked against Sharma, Wu and Dalal's table
 * (./colour/delta-e.test.ts). Then the marks: which colours a reviewer is warned about.
 */
import { execFileSync } from 'node:child_process';
import { resolve } from 'node:path';
import { Jimp } from 'jimp';
import { beforeAll, describe, expect, it } from 'vitest';
import { demoGameWithArt } from '../demo/demo-art';
import type { Game } from '../game/model';
import { PressColour } from './colour/cmm';
import { deltaE2000, GAMUT_WARNING_DELTA_E2000 } from './colour/delta-e';
import { BUILTIN_PRESS_PROFILE_FILE, builtinPressProfile } from './colour/press-profiles';
import { loadGameImages } from './job';
import { layoutFace } from './layout/index';
import { loadFonts } from './fonts';
import { mmToPx } from './png';
import { faceWidthMm, faceHeightMm } from './display-list';
import { GAMUT_MARK_RGB, SOFT_PROOF_DPI, softProofFace, softProofPixels } from './soft-proof';

const PROFILE = resolve(BUILTIN_PRESS_PROFILE_FILE);

/** transicc over a few lines of input; returns the numeric lines. */
function transicc(args: string[], rows: number[][]): number[][] {
	const out = execFileSync('transicc', [...args, '-n'], { input: rows.map((r) => r.join(' ')).join('\n') + '\n', encoding: 'utf8' });
	return out
		.split('\n')
		.map((l) => l.trim())
		.filter((l) => /^-?[\d.]+(\s+-?[\d.]+)+$/.test(l))
		.map((l) => l.split(/\s+/).map(Number));
}

/** Screen colours: a screen green and blue (outside a coated press's gamut), red, a card green, skin, greys, white, black. */
const SAMPLES = [
	[0, 255, 0],
	[20, 40, 200],
	[255, 0, 0],
	[46, 160, 67],
	[230, 180, 150],
	[128, 128, 128],
	[30, 30, 30],
	[255, 255, 255],
	[0, 0, 0]
];

let press: PressColour;
beforeAll(async () => {
	press = await PressColour.open((await builtinPressProfile()).icc, 'relative');
});

describe('soft proof', () => {
	it('each colour’s ΔE2000 equals the one computed from transicc’s Lab values, within 1', () => {
		// sRGB → Lab (D50), sRGB → CMYK (relative colorimetric, black-point compensation) → Lab, all by transicc.
		const artLab = transicc(['-i', '*sRGB', '-o', '*Lab', '-t', '1'], SAMPLES);
		const cmyk = transicc(['-i', '*sRGB', '-o', PROFILE, '-t', '1', '-b'], SAMPLES);
		const printedLab = transicc(['-i', PROFILE, '-o', '*Lab', '-t', '1', '-b'], cmyk);
		expect(artLab).toHaveLength(SAMPLES.length);
		expect(printedLab).toHaveLength(SAMPLES.length);
		const ours = press.softProof(new Uint8Array(SAMPLES.flat())).deltaE2000;
		SAMPLES.forEach((rgb, i) => {
			const theirs = deltaE2000(artLab[i], printedLab[i]);
			// Ours goes through 8-bit CMYK, transicc through floats: a fraction of a unit apart.
			expect(Math.abs(ours[i] - theirs), `${rgb}: ${ours[i]} vs ${theirs}`).toBeLessThanOrEqual(1);
		});
	});

	it(`marks the screen green and blue (over ${GAMUT_WARNING_DELTA_E2000} ΔE2000), not greys, black, white, skin or a card green`, () => {
		const marked = SAMPLES.map((rgb) => {
			// An 8 × 8 patch of the colour: the stripes cover half of it when it is marked.
			const patch = new Uint8Array(Array.from({ length: 64 }, () => rgb).flat());
			const p = softProofPixels(patch, 8, 8, { press });
			const pink = [...Array(64).keys()].filter((i) => GAMUT_MARK_RGB.every((v, c) => p.rgba[i * 4 + c] === v)).length;
			return { rgb, moved: p.movedShare, pink };
		});
		const byColour = (rgb: number[]) => marked.find((m) => m.rgb === rgb)!;
		for (const rgb of [SAMPLES[0], SAMPLES[1]]) {
			expect(byColour(rgb).moved, String(rgb)).toBe(1);
			expect(byColour(rgb).pink, String(rgb)).toBe(32);
		}
		for (const rgb of SAMPLES.slice(3)) {
			expect(byColour(rgb).moved, String(rgb)).toBe(0);
			expect(byColour(rgb).pink, String(rgb)).toBe(0);
		}
	});

	it('a higher threshold marks less; mark: false shows the print look alone', () => {
		const red = new Uint8Array([255, 0, 0]);
		expect(softProofPixels(red, 1, 1, { press, thresholdDeltaE2000: 3 }).movedShare).toBe(1);
		expect(softProofPixels(red, 1, 1, { press, thresholdDeltaE2000: 10 }).movedShare).toBe(0);
		const plain = softProofPixels(new Uint8Array([0, 255, 0]), 1, 1, { press, mark: false });
		expect([...plain.rgba.subarray(0, 3)]).not.toEqual([...GAMUT_MARK_RGB]);
		// Printed, the screen green is duller: its green lead over the other channels shrinks.
		expect(plain.rgba[1] - Math.max(plain.rgba[0], plain.rgba[2])).toBeLessThan(200);
	});

	it('a demo card face: a PNG of the face with bleed at 150 dpi, read back by jimp', async () => {
		const { game, art }: { game: Game; art: Map<string, Uint8Array> } = await demoGameWithArt();
		const { images } = await loadGameImages(game, art);
		const card = game.cards[0];
		const kind = game.kinds.find((k) => k.id === card.kindId)!;
		const face = layoutFace({ game, kind, card, side: 'front', images, fonts: await loadFonts() });
		const proof = await softProofFace(face, images, { press });
		const img = await Jimp.read(Buffer.from(proof.png));
		expect(img.width).toBe(mmToPx(faceWidthMm(face), SOFT_PROOF_DPI));
		expect(img.height).toBe(mmToPx(faceHeightMm(face), SOFT_PROOF_DPI));
		expect(proof.movedShare).toBeGreaterThanOrEqual(0);
		expect(proof.movedShare).toBeLessThan(1);
		expect(proof.maxDeltaE2000).toBeGreaterThan(0);
	});
});
