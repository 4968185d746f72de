/**
 * Card faces for the app: a card of a game (saved, or as typed in an editor) laid out by the
 * print engine and drawn as SVG. Images come from the content-addressed art files.
 */
import { randomBytes } from 'node:crypto';
import { loadFonts, FONT_FAMILY, type FontSet } from '$lib/print/fonts';
import type { Side } from '$lib/print/layout';
import type { GuideOptions } from '$lib/print/svg';
import type { FaceLayout } from '$lib/print/display-list';
import type { Card, CardKind, Game } from '$lib/game/model';
import { readArtFile } from './art-files';
import { artAssets, linkedFaceSvg } from '$lib/print/face-svg';

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
	// In a page: the very function the browser's live preview draws with.
	if (req.artUrl) return linkedFaceSvg({ ...req, artUrl: req.artUrl, fonts: await loadFonts() });
	const { face, layout } = await renderFaceTemplate(req);
	return { svg: await standaloneSvg(face), layout };
}

/**
 * A standalone face without its heavy parts: the SVG with a mark where each art file goes, and
 * the art it names. The art (tens of KB each) and the fonts (~38 KB) are the same in every face
 * of a game, so the face cache keeps this and each answer fills them in (`standaloneSvg`).
 */
export interface FaceTemplate {
	svg: string;
	/** Each art file the SVG marks: its content hash and type. */
	art: [sha256: string, mime: string][];
}

/**
 * Where an art file's data goes in a template. Random per process: text typed on a card is never
 * taken for a mark, and templates live in this process only.
 */
const ART_MARK = `paddock-art-${randomBytes(12).toString('hex')}:`;

export async function renderFaceTemplate(req: Omit<FaceRequest, 'artUrl'>): Promise<{ face: FaceTemplate; layout: FaceLayout }> {
	const assets = artAssets(req.game);
	const art = new Map<string, string>();
	const { svg, layout } = linkedFaceSvg({
		...req,
		fonts: await loadFonts(),
		artUrl: (sha) => {
			art.set(sha, assets.get(sha)!.mime);
			return ART_MARK + sha;
		}
	});
	return { face: { svg, art: [...art] }, layout };
}

/** The face as a file or an <img> needs it: its art as data: URIs and the fonts it is set in. */
export async function standaloneSvg(face: FaceTemplate): Promise<string> {
	let svg = face.svg;
	for (const [sha, mime] of face.art) {
		const bytes = await readArtFile(sha);
		const uri = `data:${mime};base64,${Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('base64')}`;
		svg = svg.replaceAll(ART_MARK + sha, () => uri);
	}
	// A standalone SVG cannot use the page's fonts: carry them along.
	const style = await fontStyle();
	return svg.replace(/<svg\b[^>]*>/, (open) => open + style);
}

let fontStyleText: Promise<string> | undefined;

/** Both weights as an SVG style element with the woff2 files inline, made once per process. */
function fontStyle(): Promise<string> {
	fontStyleText ??= loadFonts().then((fonts: FontSet) => {
		const face = (weight: number, bytes: Uint8Array) =>
			`@font-face{font-family:'${FONT_FAMILY}';font-weight:${weight};src:url(data:font/woff2;base64,${Buffer.from(bytes).toString('base64')}) format('woff2')}`;
		return `<style>${face(400, fonts.regular.woff2)}${face(700, fonts.bold.woff2)}</style>`;
	});
	return fontStyleText;
}

export function parseGuides(value: string | null): boolean | GuideOptions {
	if (!value || value === '0' || value === 'none') return false;
	if (value === '1' || value === 'all') return true;
	const parts = new Set(value.split(','));
	return { trim: parts.has('trim'), bleed: parts.has('bleed'), safe: parts.has('safe') };
}
