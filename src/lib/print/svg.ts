/**
 * SVG backend: one card face (display list) → a standalone SVG document in millimetres.
 *
 * Used for the live preview in the browser and, through resvg (./png.ts), for PNG export.
 * Text is drawn at the baselines the layout measured (./text.ts); nothing is re-flowed here.
 */
import {
	faceHeightMm,
	faceWidthMm,
	type Colour,
	type DisplayItem,
	type FaceLayout,
	type ImageAsset
} from './display-list';
import { ptToMm } from './text';

/** Where image bytes come from: the assets themselves (inlined as data: URIs) or a URL per image id. */
export type ImageSource = Map<string, ImageAsset> | ((imageId: string) => string | undefined);

export interface GuideOptions {
	/** The cut line (solid). */
	trim?: boolean;
	/** The outer edge of the bleed, with the bleed area shaded. */
	bleed?: boolean;
	/** The safe area inside the trim (dashed). */
	safe?: boolean;
}

export interface SvgOptions {
	/** Preview overlay, off unless asked for; `true` shows all three guides. */
	guides?: boolean | GuideOptions;
	fontFamily?: string;
}

/** The cards' typeface (as in ./fonts.ts, repeated so this module has no Node import and runs in a browser). */
const DEFAULT_FONT_FAMILY = 'Roboto Slab';

/** Guide colours: chosen to stand out on any card; they never print (overlay only). */
const GUIDE = {
	trim: '#e8175d',
	bleed: '#1c7ed6',
	safe: '#2b8a3e',
	strokeMm: 0.2,
	dashMm: [1.2, 0.8]
};

/** XML 1.0 §2.2 allows tab, LF, CR and U+0020 upwards (minus surrogates, U+FFFE/FFFF). */
// eslint-disable-next-line no-control-regex
const XML_INVALID = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g;

/** Escape text for XML character data and attribute values (XML 1.0 §2.4). */
export function escapeXml(text: string): string {
	return text
		.replace(XML_INVALID, '')
		.replace(/&/g, '&amp;')
		.replace(/</g, '&lt;')
		.replace(/>/g, '&gt;')
		.replace(/"/g, '&quot;')
		.replace(/'/g, '&apos;');
}

/** Millimetres with at most 3 decimals (1 µm: far below any printer's resolution). */
const n = (mm: number) => `${Math.round(mm * 1000) / 1000}`;

const paint = (c: Colour | undefined) => (c ? escapeXml(c.hex) : 'none');

function strokeAttrs(stroke: Colour | undefined, strokeMm: number | undefined): string {
	if (!stroke || !strokeMm) return '';
	return ` stroke="${paint(stroke)}" stroke-width="${n(strokeMm)}"`;
}

const B64 = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';

/** Base64 (RFC 4648 §4) without depending on Node's Buffer, so the module also runs in a browser. */
export function base64(bytes: Uint8Array): string {
	let out = '';
	let i = 0;
	for (; i + 2 < bytes.length; i += 3) {
		const v = (bytes[i] << 16) | (bytes[i + 1] << 8) | bytes[i + 2];
		out += B64[v >> 18] + B64[(v >> 12) & 63] + B64[(v >> 6) & 63] + B64[v & 63];
	}
	const rest = bytes.length - i;
	if (rest === 1) {
		const v = bytes[i] << 16;
		out += B64[v >> 18] + B64[(v >> 12) & 63] + '==';
	} else if (rest === 2) {
		const v = (bytes[i] << 16) | (bytes[i + 1] << 8);
		out += B64[v >> 18] + B64[(v >> 12) & 63] + B64[(v >> 6) & 63] + '=';
	}
	return out;
}

function imageHref(images: ImageSource, imageId: string): string | undefined {
	if (typeof images === 'function') return images(imageId);
	const asset = images.get(imageId);
	return asset ? `data:${asset.mime};base64,${base64(asset.bytes)}` : undefined;
}

function guideOptions(guides: SvgOptions['guides']): Required<GuideOptions> {
	if (guides === true) return { trim: true, bleed: true, safe: true };
	if (!guides) return { trim: false, bleed: false, safe: false };
	return { trim: !!guides.trim, bleed: !!guides.bleed, safe: !!guides.safe };
}

/** A rounded rectangle as path data (clockwise), for shaded regions with holes. */
function roundedRectPath(x: number, y: number, w: number, h: number, r: number): string {
	r = Math.max(0, Math.min(r, w / 2, h / 2));
	if (r === 0) return `M${n(x)} ${n(y)}H${n(x + w)}V${n(y + h)}H${n(x)}Z`;
	return (
		`M${n(x + r)} ${n(y)}H${n(x + w - r)}A${n(r)} ${n(r)} 0 0 1 ${n(x + w)} ${n(y + r)}` +
		`V${n(y + h - r)}A${n(r)} ${n(r)} 0 0 1 ${n(x + w - r)} ${n(y + h)}` +
		`H${n(x + r)}A${n(r)} ${n(r)} 0 0 1 ${n(x)} ${n(y + h - r)}` +
		`V${n(y + r)}A${n(r)} ${n(r)} 0 0 1 ${n(x + r)} ${n(y)}Z`
	);
}

function guidesSvg(face: FaceLayout, show: Required<GuideOptions>): string {
	const w = faceWidthMm(face);
	const h = faceHeightMm(face);
	const b = face.bleedMm;
	const r = face.cornerRadiusMm ?? 0;
	const parts: string[] = [];
	const s = GUIDE.strokeMm;
	if (show.bleed) {
		// Shade what the cut removes, so the preview reads as the finished card.
		parts.push(
			`<path d="M0 0H${n(w)}V${n(h)}H0Z${roundedRectPath(b, b, face.trimWidthMm, face.trimHeightMm, r)}" fill="#ffffff" fill-opacity="0.35" fill-rule="evenodd"/>`,
			`<rect x="${n(s / 2)}" y="${n(s / 2)}" width="${n(w - s)}" height="${n(h - s)}" fill="none" stroke="${GUIDE.bleed}" stroke-width="${n(s)}"/>`
		);
	}
	if (show.trim)
		parts.push(
			`<rect x="${n(b)}" y="${n(b)}" width="${n(face.trimWidthMm)}" height="${n(face.trimHeightMm)}" rx="${n(r)}" fill="none" stroke="${GUIDE.trim}" stroke-width="${n(s)}"/>`
		);
	if (show.safe) {
		const i = b + face.safeMm;
		parts.push(
			`<rect x="${n(i)}" y="${n(i)}" width="${n(face.trimWidthMm - 2 * face.safeMm)}" height="${n(face.trimHeightMm - 2 * face.safeMm)}" fill="none" stroke="${GUIDE.safe}" stroke-width="${n(s)}" stroke-dasharray="${GUIDE.dashMm.map(n).join(' ')}"/>`
		);
	}
	return parts.length ? `<g id="guides">${parts.join('')}</g>` : '';
}

/** Render one face as an SVG document whose user unit is 1 mm. */
export function renderSvg(face: FaceLayout, images: ImageSource, opts: SvgOptions = {}): string {
	const w = faceWidthMm(face);
	const h = faceHeightMm(face);
	const family = escapeXml(opts.fontFamily ?? DEFAULT_FONT_FAMILY);
	const defs: string[] = [];
	const body: string[] = [];

	const itemSvg = (item: DisplayItem): string => {
		switch (item.type) {
			case 'rect': {
				const rx = item.radiusMm ? ` rx="${n(item.radiusMm)}"` : '';
				return `<rect x="${n(item.xMm)}" y="${n(item.yMm)}" width="${n(item.wMm)}" height="${n(item.hMm)}"${rx} fill="${paint(item.fill)}"${strokeAttrs(item.stroke, item.strokeMm)}/>`;
			}
			case 'ellipse':
				return `<ellipse cx="${n(item.cxMm)}" cy="${n(item.cyMm)}" rx="${n(item.rxMm)}" ry="${n(item.ryMm)}" fill="${paint(item.fill)}"${strokeAttrs(item.stroke, item.strokeMm)}/>`;
			case 'line': {
				const dash = item.dashMm?.length ? ` stroke-dasharray="${item.dashMm.map(n).join(' ')}"` : '';
				return `<line x1="${n(item.x1Mm)}" y1="${n(item.y1Mm)}" x2="${n(item.x2Mm)}" y2="${n(item.y2Mm)}" stroke="${paint(item.stroke)}" stroke-width="${n(item.strokeMm)}"${dash}/>`;
			}
			case 'path':
				return `<path d="${escapeXml(item.d)}" fill="${paint(item.fill)}"${strokeAttrs(item.stroke, item.strokeMm)} stroke-linejoin="round"/>`;
			case 'text': {
				const weight = item.weight === 'bold' ? 700 : 400;
				return `<text x="${n(item.xMm)}" y="${n(item.yMm)}" font-family="${family}" font-size="${n(ptToMm(item.sizePt))}" font-weight="${weight}" fill="${paint(item.fill)}">${escapeXml(item.text)}</text>`;
			}
			case 'image': {
				const href = imageHref(images, item.imageId);
				if (!href) return '';
				const box = item.clip ?? { xMm: item.xMm, yMm: item.yMm, wMm: item.wMm, hMm: item.hMm };
				const id = `clip${defs.length}`;
				const rx = item.radiusMm ? ` rx="${n(item.radiusMm)}"` : '';
				defs.push(
					`<clipPath id="${id}"><rect x="${n(box.xMm)}" y="${n(box.yMm)}" width="${n(box.wMm)}" height="${n(box.hMm)}"${rx}/></clipPath>`
				);
				// The layout already sized the box to the image's aspect, so no further fitting here.
				return `<image href="${escapeXml(href)}" x="${n(item.xMm)}" y="${n(item.yMm)}" width="${n(item.wMm)}" height="${n(item.hMm)}" preserveAspectRatio="none" clip-path="url(#${id})"/>`;
			}
		}
	};

	for (const item of face.items) body.push(itemSvg(item));
	const guides = guidesSvg(face, guideOptions(opts.guides));
	return (
		`<svg xmlns="http://www.w3.org/2000/svg" width="${n(w)}mm" height="${n(h)}mm" viewBox="0 0 ${n(w)} ${n(h)}">` +
		(defs.length ? `<defs>${defs.join('')}</defs>` : '') +
		`<g id="face">${body.join('')}</g>` +
		guides +
		`</svg>`
	);
}
