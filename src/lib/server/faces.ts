/**
 * Card faces for the app: a card of a game (saved, or as typed in an editor) laid out by the
 * print engine and drawn as SVG. Images come from the content-addressed art files.
 */
import { loadFonts, FONT_FAMILY, type FontSet } from '$lib/print/fonts';
import { layoutFace, type Side } from '$lib/print/layout';
import { renderSvg, type GuideOptions } from '$lib/print/svg';
import type { FaceLayout, ImageAsset } from '$lib/print/display-list';
import type { Card, CardKind, Game } from '$lib/game/model';
import { readArtFile } from './art-files';

/** The game's art as ImageAssets; bytes are read only when the SVG embeds them. */
export async function gameImages(game: Game, withBytes: boolean): Promise<Map<string, ImageAsset>> {
	const images = new Map<string, ImageAsset>();
	for (const a of game.art) {
		if (images.has(a.sha256) || a.mime === 'image/svg+xml') continue;
		images.set(a.sha256, {
			id: a.sha256,
			mime: a.mime,
			bytes: withBytes ? await readArtFile(a.sha256) : new Uint8Array(),
			widthPx: a.widthPx,
			heightPx: a.heightPx
		});
	}
	return images;
}

export interface FaceRequest {
	game: Game;
	kind: CardKind;
	card?: Card;
	side: Side;
	guides?: boolean | GuideOptions;
	/** Link images to this URL prefix (in-page preview) instead of embedding them (downloads). */
	artUrl?: (sha256: string) => string;
}

export async function renderFace(req: FaceRequest): Promise<{ svg: string; layout: FaceLayout }> {
	const fonts = await loadFonts();
	const images = await gameImages(req.game, !req.artUrl);
	const layout = layoutFace({ game: req.game, kind: req.kind, card: req.card, side: req.side, images, fonts });
	const source = req.artUrl ? (id: string) => (images.has(id) ? req.artUrl!(id) : undefined) : images;
	const svg = renderSvg(layout, source, { guides: req.guides });
	// A standalone SVG (opened as a file or an <img>) cannot use the page's fonts: carry them along.
	return { svg: req.artUrl ? svg : withFonts(svg, fonts), layout };
}

function withFonts(svg: string, fonts: FontSet): string {
	const face = (weight: number, bytes: Uint8Array) =>
		`@font-face{font-family:'${FONT_FAMILY}';font-weight:${weight};src:url(data:font/woff2;base64,${Buffer.from(bytes).toString('base64')}) format('woff2')}`;
	const style = `<style>${face(400, fonts.regular.woff2)}${face(700, fonts.bold.woff2)}</style>`;
	return svg.replace(/(<svg\b[^>]*>)/, `$1${style}`);
}

export function parseGuides(value: string | null): boolean | GuideOptions {
	if (!value || value === '0' || value === 'none') return false;
	if (value === '1' || value === 'all') return true;
	const parts = new Set(value.split(','));
	return { trim: parts.has('trim'), bleed: parts.has('bleed'), safe: parts.has('safe') };
}
