/**
 * PDF/X against plain press output for the demo game: how long a build takes and how large the
 * file is, for (a) one card's press file (the first card with a runner's art), (b) every card's
 * press file one after another, (c) the whole game's imposed sheets. Each is built cold (an
 * empty cache: art decoded and, for PDF/X, converted to CMYK through the profile) and warm (the
 * same cache again). Plain means the press file as it was before PDF/X: DeviceCMYK by formula
 * for colours, RGB pictures, no output intent. Run alone with `npx tsx scripts/bench/pdfx.ts`.
 */
import { availableParallelism, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { demoGameWithArt } from '../../src/lib/demo/demo-art';
import { PrintCache } from '../../src/lib/print/cache';
import { builtinPressProfile } from '../../src/lib/print/colour/press-profiles';
import { buildCardPressPdf } from '../../src/lib/print/press-job';
import { buildGamePdf, type GamePdfOptions } from '../../src/lib/print/sheet-job';
import type { PdfxTarget } from '../../src/lib/print/pdfx';

interface Timed {
	coldMs: number;
	warmMs: number;
	bytes: number;
}

export interface PdfxBench {
	loadAverage: number;
	repeats: number;
	oneCard: { plain: Timed; pdfx4: Timed };
	everyCard: { cards: number; plain: Timed; pdfx4: Timed };
	sheets: { plain: Timed; pdfx4: Timed };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const round = (ms: number) => Math.round(ms);

/** Cold (fresh cache) then warm (the same cache), `repeats` times each; medians. */
async function timed(repeats: number, build: (cache: PrintCache) => Promise<Uint8Array>): Promise<Timed> {
	const cold: number[] = [];
	const warm: number[] = [];
	let bytes = 0;
	for (let i = 0; i < repeats; i++) {
		const cache = new PrintCache();
		let t = performance.now();
		bytes = (await build(cache)).length;
		cold.push(performance.now() - t);
		t = performance.now();
		await build(cache);
		warm.push(performance.now() - t);
	}
	return { coldMs: round(median(cold)), warmMs: round(median(warm)), bytes };
}

export async function benchPdfx(repeats = 3): Promise<PdfxBench> {
	const load = loadavg()[0];
	console.log(`\nPDF/X-4 against plain press output, demo game (load average ${load.toFixed(1)} on ${availableParallelism()} cores):`);
	const { game, art } = await demoGameWithArt();
	const pdfx: PdfxTarget = { standard: 'pdfx4', profile: await builtinPressProfile(), intent: 'relative' };
	const date = '2026-01-01';
	// A movement card carries its runner's portrait: a press file with a picture to convert.
	const card = game.cards.find((c) => c.data.type === 'movement') ?? game.cards[0];
	// Warm the process once (fonts, wasm, LittleCMS) so the first figure is not the start-up.
	await buildCardPressPdf(game, art, card.id, { pdfx, date, cache: new PrintCache() });

	const press = (id: string, cache: PrintCache, withPdfx: boolean) =>
		buildCardPressPdf(game, art, id, { date, cache, ...(withPdfx ? { pdfx } : { colour: 'cmyk' as const }) }).then((r) => r.pdf);
	const oneCard = {
		plain: await timed(repeats, (cache) => press(card.id, cache, false)),
		pdfx4: await timed(repeats, (cache) => press(card.id, cache, true))
	};
	const every = async (cache: PrintCache, withPdfx: boolean) => {
		let total = 0;
		for (const c of game.cards) total += (await press(c.id, cache, withPdfx)).length;
		return new Uint8Array(total);
	};
	const everyCard = { cards: game.cards.length, plain: await timed(repeats, (c) => every(c, false)), pdfx4: await timed(repeats, (c) => every(c, true)) };
	const job: GamePdfOptions = { paper: 'a4', layout: 'spaced', duplex: 'long', marks: true, sets: 1, colour: 'cmyk', date };
	const sheets = {
		plain: await timed(repeats, (cache) => buildGamePdf(game, art, { ...job, cache }).then((r) => r.pdf)),
		pdfx4: await timed(repeats, (cache) => buildGamePdf(game, art, { ...job, pdfx, cache }).then((r) => r.pdf))
	};

	const kb = (b: number) => `${(b / 1024).toFixed(0)} KB`;
	const row = (name: string, p: Timed, x: Timed) =>
		console.log(
			`  ${name.padEnd(28)} plain ${String(p.coldMs).padStart(6)} ms cold, ${String(p.warmMs).padStart(6)} ms warm, ${kb(p.bytes).padStart(8)}` +
				` | PDF/X-4 ${String(x.coldMs).padStart(6)} ms cold, ${String(x.warmMs).padStart(6)} ms warm, ${kb(x.bytes).padStart(8)}` +
				` | ×${(x.warmMs / Math.max(1, p.warmMs)).toFixed(2)} time warm, ×${(x.bytes / p.bytes).toFixed(2)} size`
		);
	row('one card’s press file', oneCard.plain, oneCard.pdfx4);
	row(`every card (${everyCard.cards}) one by one`, everyCard.plain, everyCard.pdfx4);
	row('imposed sheets (A4)', sheets.plain, sheets.pdfx4);
	return { loadAverage: Math.round(load * 10) / 10, repeats, oneCard, everyCard, sheets };
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
	await benchPdfx(Number(process.argv[2] ?? 3));
}
