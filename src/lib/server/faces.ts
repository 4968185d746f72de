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
import { artAssets, linkedFaceSvg } from '$lib/print/face-svg';

/** The game's art as ImageAssets; bytes are read only when the SVG embeds them. */
export async function gameImages(game: Game, withBytes: boolean): Promise<Map<string, ImageAsset>> {
	const images = artAssets(game);
	if (withBytes) for (const image of images.values()) image.bytes = await readArtFile(image.id);
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
	// In a page: the very function the browser's live preview draws with.
	if (req.artUrl) return linkedFaceSvg({ ...req, artUrl: req.artUrl, fonts });
	const images = await gameImages(req.game, true);
	const layout = layoutFace({ game: req.game, kind: req.kind, card: req.card, side: req.side, images, fonts });
	const svg = renderSvg(layout, images, { guides: req.guides });
	// A standalone SVG (opened as a file or an <img>) cannot use the page's fonts: carry them along.
	return { svg: withFonts(svg, fonts), layout };
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
