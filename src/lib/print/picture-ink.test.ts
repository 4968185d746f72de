/**
 * Total ink of pictures: art whose converted CMYK goes over the printing condition's limit is
 * warned about, naming the card it is on and the figure. The figure is checked against
 * LittleCMS's own command-line tool (`transicc`, Debian's liblcms2-utils) on the same profile,
 * so the warning reports what the reference conversion gives, not only what our code computed.
 */
import { execFileSync } from 'node:child_process';
import { resolve } from 'node:path';
import { Jimp } from 'jimp';
import { beforeAll, describe, expect, it } from 'vitest';
import { demoGameWithArt } from '../demo/demo-art';
import type { Game } from '../game/model';
import { BUILTIN_PRESS_PROFILE_FILE, builtinPressProfile } from './colour/press-profiles';
import type { PressProfile } from './colour/cmm';
import { PrintCache } from './cache';
import { buildCardPressPdf } from './press-job';
import { buildGamePdf } from './sheet-job';
import { parsePrintOptions } from './options';

/** A deep screen black: through the built-in profile it prints near 300 % (transicc below). */
const DARK = [0, 0, 0] as const;

/** transicc's CMYK (in %) for one sRGB colour: relative colorimetric (`-t 1`) with black-point compensation (`-b`). */
function transiccCmyk(rgb: readonly number[]): number[] {
	const out = execFileSync('transicc', ['-i', '*sRGB', '-o', resolve(BUILTIN_PRESS_PROFILE_FILE), '-t', '1', '-b', '-n'], {
		input: rgb.join(' ') + '\n',
		encoding: 'utf8'
	});
	const line = out.split('\n').find((l) => /^[\d.\s]+$/.test(l.trim()) && l.trim());
	return line!.trim().split(/\s+/).map(Number);
}

let game: Game;
let art: Map<string, Uint8Array>;
let builtin: PressProfile;
let cardId: string;
let cardName: string;
const FILE = 'icon-thistle.png';

beforeAll(async () => {
	({ game, art } = await demoGameWithArt());
	builtin = await builtinPressProfile();
	// One card's own picture becomes a solid deep black of the same size.
	const asset = game.art.find((a) => a.fileName === FILE && a.assignment?.scope === 'card')!;
	const card = game.cards.find((c) => c.id === asset.assignment!.targetId)!;
	cardId = card.id;
	cardName = card.name;
	const png = await new Jimp({ width: asset.widthPx, height: asset.heightPx, color: ((DARK[0] << 24) | (DARK[1] << 16) | (DARK[2] << 8) | 0xff) >>> 0 }).getBuffer('image/png');
	art.set(asset.sha256, new Uint8Array(png));
});

/** The figure in a picture warning, e.g. "… prints with 301 % total ink, over the 280 % limit …". */
const figureOf = (w: string) => Number(/prints with (\d+) % total ink/.exec(w)![1]);

describe('total ink of pictures', () => {
	// A printer's stated limit below what the profile gives for deep black (uncoated and
	// newsprint conditions often ask 260–300 %, common practice; values from memory).
	const LIMIT = 280;

	it('a picture over the limit is named with its card and its total ink, as transicc converts it', async () => {
		const expected = transiccCmyk(DARK).reduce((a, b) => a + b, 0);
		expect(expected).toBeGreaterThan(LIMIT);
		const profile = { ...builtin, totalInkLimitPct: LIMIT };
		const { warnings } = await buildCardPressPdf(game, art, cardId, { pdfx: { standard: 'pdfx4', profile, intent: 'relative' }, cache: new PrintCache() });
		const mine = warnings.filter((w) => w.includes(`the picture “${FILE}”`));
		expect(mine, warnings.join('\n')).toHaveLength(1);
		expect(mine[0]).toContain(`on card “${cardName}”`);
		expect(mine[0]).toContain(`over the ${LIMIT} % limit of FOGRA39`);
		// 8-bit pixels: each ink within 1/255, so the sum within about 2 % of transicc's.
		expect(Math.abs(figureOf(mine[0]) - expected)).toBeLessThanOrEqual(2);
	});

	it('sheets name the card too', async () => {
		const kindId = game.cards.find((c) => c.id === cardId)!.kindId;
		const profile = { ...builtin, totalInkLimitPct: LIMIT };
		const { warnings } = await buildGamePdf(game, art, {
			...parsePrintOptions({ paper: 'a4', kinds: kindId }),
			pdfx: { standard: 'pdfx4', profile, intent: 'relative' },
			cache: new PrintCache()
		});
		const mine = warnings.filter((w) => w.includes(`the picture “${FILE}” on card “${cardName}”`));
		expect(mine, warnings.join('\n')).toHaveLength(1);
	});

	it('within the built-in profile’s 330 % the same picture is not warned about', async () => {
		const { warnings } = await buildCardPressPdf(game, art, cardId, { pdfx: { standard: 'pdfx4', profile: builtin, intent: 'relative' }, cache: new PrintCache() });
		expect(warnings.filter((w) => w.includes('total ink'))).toEqual([]);
	});
});
