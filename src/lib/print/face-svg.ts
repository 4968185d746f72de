/**
 * One face as the in-page preview shows it: laid out by the engine and drawn as SVG, its art
 * linked by URL and its text set in the page's own Roboto Slab. No Node import: the browser
 * redraws with it on every keystroke, and the server's preview answer is the same function.
 */
import type { Card, CardKind } from '../game/model';
import type { FaceLayout, ImageAsset } from './display-list';
import { layoutFace, type LayoutGame, type Side } from './layout';
import { renderSvg, type GuideOptions } from './svg';
import type { MeasuringFonts } from './typeface';

/** The game's raster art as ImageAssets without their bytes (a linked SVG needs only the sizes). */
export function artAssets(game: Pick<LayoutGame, 'art'>): Map<string, ImageAsset> {
	const images = new Map<string, ImageAsset>();
	for (const a of game.art) {
		if (images.has(a.sha256) || a.mime === 'image/svg+xml') continue;
		images.set(a.sha256, { id: a.sha256, mime: a.mime, bytes: new Uint8Array(), widthPx: a.widthPx, heightPx: a.heightPx });
	}
	return images;
}

export interface LinkedFaceInput {
	game: LayoutGame;
	kind: CardKind;
	card?: Card;
	side: Side;
	guides?: boolean | GuideOptions;
	fonts: MeasuringFonts;
	/** Where the page reads an art file, by its content hash. */
	artUrl: (sha256: string) => string;
}

export function linkedFaceSvg(input: LinkedFaceInput): { svg: string; layout: FaceLayout } {
	const images = artAssets(input.game);
	const layout = layoutFace({ game: input.game, kind: input.kind, card: input.card, side: input.side, images, fonts: input.fonts });
	const svg = renderSvg(layout, (id) => (images.has(id) ? input.artUrl(id) : undefined), { guides: input.guides });
	return { svg, layout };
}
