/** What a press standard says of a build: total-ink warnings naming the picture, and PDF/X-1a refusals. */
import type { Game } from '../game/model';
import type { FaceLayout } from './display-list';
import { PrintOptionsError } from './options';
import { PressImageError } from './pdf-image';
import type { PdfxTarget } from './pdfx';

/** A press standard's refusal (transparency in PDF/X-1a) is a refusal of the request, not a failure. */
export async function pressBuild<T>(build: () => Promise<T>): Promise<T> {
	try {
		return await build();
	} catch (e) {
		if (e instanceof PressImageError) throw new PrintOptionsError(`This game cannot be PDF/X-1a: ${e.message}`);
		throw e;
	}
}

/** A picture in a warning: its file name and the cards it is on (a few by name, then a count). */
export function pictureWords(game: Game, imageId: string, cards: { cardName: string; front: FaceLayout; back?: FaceLayout }[]): string {
	const file = game.art.find((a) => a.sha256 === imageId)?.fileName ?? imageId.slice(0, 12);
	const uses = (f?: FaceLayout) => !!f?.items.some((i) => i.type === 'image' && i.imageId === imageId);
	const names = [...new Set(cards.filter((c) => uses(c.front) || uses(c.back)).map((c) => `“${c.cardName}”`))];
	const shown = names.slice(0, 3).join(', ') + (names.length > 3 ? ` and ${names.length - 3} more` : '');
	return `the picture “${file}”${names.length ? ` on ${names.length === 1 ? 'card' : 'cards'} ${shown}` : ''}`;
}

/** The total-ink warning: what, how much, the limit and where the limit comes from. */
export function inkWarning(what: string, pct: number, pdfx: PdfxTarget): string {
	const p = pdfx.profile;
	return (
		`${what} prints with ${Math.round(pct)} % total ink, over the ${p.totalInkLimitPct} % limit of ${p.conditionIdentifier}; ` +
		`the press may smear or set off there (lighten the rich black or the colour)`
	);
}

