/** One card's press file: front and back with TrimBox and BleedBox (./press.ts), CMYK unless asked. */
import type { Card, CardKind, Game } from '../game/model';
import { faceBytes, faceKey, printCache, type PrintCache } from './cache';
import { loadFonts } from './fonts';
import { PrintOptionsError } from './options';
import { layoutFace } from './layout/index';
import type { ColourMode } from './pdf';
import { buildPressPdf } from './press';
import type { PdfxTarget } from './pdfx';
import { loadGameImages } from './job';
import { pressBuild, pictureWords, inkWarning } from './press-checks';

export interface CardPressOptions {
	colour?: ColourMode;
	/** PDF/X for a press profile (colour is then the profile's CMYK). */
	pdfx?: PdfxTarget;
	cropMarks?: boolean;
	/** YYYY-MM-DD, the document's date (a proof's date keeps its press files the same bytes). */
	date?: string;
	cache?: PrintCache;
}

function findCard(game: Game, cardId: string): { card: Card; kind: CardKind } {
	const card = game.cards.find((c) => c.id === cardId);
	if (!card) throw new PrintOptionsError(`This game has no card “${cardId}”`, 404);
	const kind = game.kinds.find((k) => k.id === card.kindId);
	if (!kind) throw new PrintOptionsError(`Card “${card.name}” belongs to a missing card kind`);
	return { card, kind };
}

/** One card's press file: front on page 1, back on page 2, TrimBox and BleedBox set (CMYK unless asked). */
export async function buildCardPressPdf(
	game: Game,
	art: ReadonlyMap<string, Uint8Array>,
	cardId: string,
	options: CardPressOptions = {}
): Promise<{ pdf: Uint8Array; warnings: string[] }> {
	const { card, kind } = findCard(game, cardId);
	const cache = options.cache ?? printCache;
	const [fonts, { images, warnings }] = await Promise.all([loadFonts(), loadGameImages(game, art, cache)]);
	const layout = (side: 'front' | 'back') =>
		cache.getOrMake('layout', faceKey(game, kind, card, side, images), () => layoutFace({ game, kind, card, side, images, fonts }), faceBytes);
	const front = await layout('front');
	const back = await layout('back');
	const ink: string[] = [];
	const pdf = await pressBuild(() =>
		buildPressPdf({
			title: `${game.name} — ${card.name}`,
			front,
			back,
			images,
			colour: options.colour ?? 'cmyk',
			cropMarks: options.cropMarks ?? false,
			fonts,
			imageStore: cache,
			date: options.date,
			pdfx: options.pdfx,
			onInkOver: (what, pct, imageId) =>
				ink.push(inkWarning(imageId ? pictureWords(game, imageId, [{ cardName: card.name, front, back }]) : what, pct, options.pdfx!))
		})
	);
	return { pdf, warnings: [...warnings, ...front.warnings, ...back.warnings, ...ink] };
}

