/**
 * The live preview drawn in the browser: the print engine's own layout and SVG backend, measuring
 * with the shipped Roboto Slab files (the same files the page's text is set in), so a keystroke
 * redraws a face without asking the server. The server's render stays the authority for print.
 */
import regularUrl from '@fontsource/roboto-slab/files/roboto-slab-latin-400-normal.woff2?url';
import boldUrl from '@fontsource/roboto-slab/files/roboto-slab-latin-700-normal.woff2?url';
import { linkedFaceSvg, type LinkedFaceInput } from '$lib/print/face-svg';
import { measuringFonts, type MeasuringFonts } from '$lib/print/typeface';

let loading: Promise<MeasuringFonts> | undefined;

async function fontBytes(url: string): Promise<Uint8Array> {
	const res = await fetch(url);
	if (!res.ok) throw new Error(`The card typeface could not be loaded (${res.status})`);
	return new Uint8Array(await res.arrayBuffer());
}

/** Both weights, fetched and parsed once per page; a failed load is tried again on the next call. */
export function previewFonts(): Promise<MeasuringFonts> {
	loading ??= Promise.all([fontBytes(regularUrl), fontBytes(boldUrl)])
		.then(([regular, bold]) => measuringFonts({ regular, bold }))
		.catch((e: unknown) => {
			loading = undefined;
			throw e;
		});
	return loading;
}

/** Where a page reads a game's art file (the route the server's preview links to as well). */
export const artFileUrl = (gameId: string) => (sha256: string) => `/api/v1/games/${gameId}/art-files/${sha256}`;

/** One face, drawn here: SVG markup and the layout's warnings. */
export function drawFace(input: LinkedFaceInput): { svg: string; warnings: string[] } {
	const { svg, layout } = linkedFaceSvg(input);
	return { svg, warnings: layout.warnings };
}
