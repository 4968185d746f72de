/**
 * SVG artwork: refuse anything that could run, reach outside the file or blow up when drawn,
 * and read the picture's size.
 *
 * Stored SVGs are later drawn by resvg and may be shown in browsers, so the rule is strict and
 * simple: a card's art must be a self-contained picture. We refuse rather than rewrite, so the
 * stored file is byte for byte what the artist sent and nothing is silently dropped from it.
 *
 * The XML is read by `sax` in strict mode (well-formedness errors refuse the file, as the XML 1.0
 * spec requires of any conforming parser) with namespaces resolved, so a prefix bound to XLink
 * under another name, or an HTML element smuggled in by namespace, is still seen for what it is.
 */
import { imageSize } from 'image-size';
import sax, { type QualifiedTag } from 'sax';
import { isPng } from './png-chunks';
import { ArtRejected } from './rejected';

export interface SvgLimits {
	/** Cap on the pixels of embedded images, each alone and all together as drawn. */
	maxPixels: number;
}

export interface SvgFacts {
	/** The picture's size as CSS px (96 per inch), rounded, at least 1. */
	widthPx: number;
	heightPx: number;
	/** Embedded PNG/JPEG images, each counted once. */
	embeddedImages: number;
}

/** Namespaces in Namespaces in XML 1.0 terms, from the SVG 1.1 and XHTML specs. */
const SVG_NS = 'http://www.w3.org/2000/svg';
const XHTML_NS = 'http://www.w3.org/1999/xhtml';

/** Our own bounds: far beyond hand-made or exported card art, short of hurting the server. */
export const MAX_SVG_DEPTH = 256;
/** Elements as drawn, each `<use>` and `url(#…)` reference counting its target again. */
export const MAX_SVG_DRAWN_ELEMENTS = 500_000;
const MAX_REFERENCE_DEPTH = 1_000;

/** CSS Values and Units Level 3 §6.2: absolute lengths in CSS px (1in = 96px = 2.54cm). */
const PX_PER_UNIT: Record<string, number> = {
	px: 1,
	in: 96,
	cm: 96 / 2.54,
	mm: 96 / 25.4,
	q: 96 / 101.6,
	pt: 96 / 72,
	pc: 16
};

/** Elements that run code or carry another document. Local names, any namespace. */
const REFUSED_ELEMENTS: Record<string, string> = {
	script: 'a <script> element',
	foreignobject: 'a <foreignObject> element (embedded HTML)',
	handler: 'a <handler> element (script)',
	listener: 'a <listener> element (script events)',
	iframe: 'an <iframe> element',
	embed: 'an <embed> element',
	object: 'an <object> element'
};

const ANIMATION_ELEMENTS = new Set(['animate', 'set', 'animatemotion', 'animatetransform', 'animatecolor']);

const SELF_CONTAINED =
	'Card art must be a self-contained picture: export it again as plain SVG (no scripts, links or ' +
	'outside files; embed bitmaps as PNG or JPEG) and upload it again.';

const unsafe = (found: string) => new ArtRejected('unsafe-svg', `This SVG contains ${found}. ${SELF_CONTAINED}`);

const notAnImage = () =>
	new ArtRejected(
		'not-an-image',
		'This file is not a PNG, JPEG or SVG image (it is text, but its root element is not <svg>).'
	);

const tooManyDrawn = () =>
	unsafe(`more than ${MAX_SVG_DRAWN_ELEMENTS.toLocaleString('en')} elements as drawn (counting each reuse)`);

/** Quote a value for a message, shortened so a huge data URL does not fill the screen. */
const quote = (value: string) => `“${value.length > 60 ? value.slice(0, 57) + '…' : value}”`;

const megapixels = (px: number) => `${(px / 1e6).toFixed(px < 1e7 ? 1 : 0)} megapixels`;

interface Drawn {
	children: Drawn[];
	/** Ids this element draws again (`<use href="#id">`, `fill="url(#id)"` and the like). */
	refs: string[];
	/** Pixels of an embedded image this element draws. */
	pixels: number;
}

/** Check an SVG document (already decoded from UTF-8) and read its size; throws ArtRejected. */
export function checkSvg(text: string, limits: SvgLimits): SvgFacts {
	const parser = sax.parser(true, { xmlns: true, strictEntities: true, position: true });
	const byId = new Map<string, Drawn>();
	const stack: { drawn: Drawn; style?: string[] }[] = [];
	let root: Drawn | undefined;
	let rootAttributes: QualifiedTag['attributes'] = {};
	/** Found before the root: reported only once we know the file is an SVG at all. */
	let beforeRoot: ArtRejected | undefined;
	let embeddedImages = 0;

	const refuse = (error: ArtRejected) => {
		if (root) throw error;
		beforeRoot ??= error;
	};

	parser.onerror = (error) => {
		if (error instanceof ArtRejected) throw error;
		if (!root) throw notAnImage();
		const what = error.message.split('\n')[0];
		throw new ArtRejected(
			'unreadable',
			`This SVG is not well-formed XML (line ${parser.line + 1}: ${what}), so it cannot be checked or drawn.`
		);
	};

	parser.ondoctype = (doctype) => {
		refuse(
			unsafe(
				/<!ENTITY/i.test(doctype)
					? 'an entity declaration (<!ENTITY …>), which can expand without bound or read other files'
					: 'a DOCTYPE declaration, which can declare entities or fetch an outside DTD'
			)
		);
	};

	parser.onsgmldeclaration = (declaration) => {
		refuse(unsafe(`a markup declaration ${quote('<!' + declaration + '>')}`));
	};

	parser.onprocessinginstruction = ({ name }) => {
		// The XML declaration comes through as a processing instruction named `xml`.
		if (name.toLowerCase() === 'xml' && !root) return;
		refuse(unsafe(`a processing instruction <?${name} …?> (such as a style sheet from another file)`));
	};

	parser.onopentag = (tag) => {
		const drawn: Drawn = { children: [], refs: [], pixels: 0 };
		if (!root) {
			if (tag.local !== 'svg') throw notAnImage();
			if (tag.uri !== SVG_NS)
				throw new ArtRejected(
					'unreadable',
					`This SVG's root element has no SVG namespace (xmlns="${SVG_NS}"), so it cannot be drawn. ` +
						'Export it again as a standalone SVG file.'
				);
			if (beforeRoot) throw beforeRoot;
			root = drawn;
			rootAttributes = tag.attributes;
		}
		if (stack.length >= MAX_SVG_DEPTH) throw unsafe(`elements nested more than ${MAX_SVG_DEPTH} deep`);
		const local = tag.local.toLowerCase();
		const refused = REFUSED_ELEMENTS[local];
		if (refused) throw unsafe(refused);
		if (tag.uri === XHTML_NS) throw unsafe(`an HTML element <${tag.name}>`);

		for (const attribute of Object.values(tag.attributes)) {
			// Namespace declarations name a vocabulary; they never load anything.
			if (attribute.name === 'xmlns' || attribute.prefix === 'xmlns') continue;
			const where = `${attribute.name} on <${tag.name}>`;
			const { local: attrLocal, value } = attribute;
			if (/^on/i.test(attrLocal)) throw unsafe(`an event handler attribute (${where}), which runs script`);
			if (attribute.prefix === 'xml' && attrLocal === 'base')
				throw unsafe(`xml:base on <${tag.name}>, which points its links at another place`);
			// URL parsers drop tabs, newlines and leading spaces, so `java&#9;script:` still runs.
			const squeezed = value.replace(/[\u0000-\u0020]+/g, '').toLowerCase();
			if (squeezed.includes('javascript:') || squeezed.includes('vbscript:'))
				throw unsafe(`a script link (${where} = ${quote(value)})`);
			if (attrLocal === 'href' || attrLocal === 'src') {
				const target = checkReference(value, where, limits);
				if (target.fragment !== undefined) drawn.refs.push(target.fragment);
				if (target.pixels) {
					drawn.pixels += target.pixels;
					embeddedImages++;
				}
			}
			// CSS is read only in attributes of no namespace (style and presentation attributes);
			// an editor's own namespaced attributes, such as layer labels, are free text.
			if (attribute.uri === '') drawn.refs.push(...checkCss(value, where));
			if (attrLocal === 'id' && (attribute.prefix === '' || attribute.prefix === 'xml')) {
				const id = value.trim();
				if (!byId.has(id)) byId.set(id, drawn);
			}
		}
		if (ANIMATION_ELEMENTS.has(local)) {
			const animated = tag.attributes.attributeName?.value.trim() ?? '';
			if (/(^|:)href$/i.test(animated) || /^on/i.test(animated))
				throw unsafe(`an animation that changes ${animated} on <${tag.name}>`);
		}

		stack.at(-1)?.drawn.children.push(drawn);
		stack.push({ drawn, style: local === 'style' ? [] : undefined });
	};

	// Text anywhere inside a <style>, even under a stray child element, counts as its style sheet.
	const onText = (text: string) => stack.findLast((open) => open.style)?.style?.push(text);
	parser.ontext = onText;
	parser.oncdata = onText;

	parser.onclosetag = () => {
		const closed = stack.pop();
		// Text, CDATA and comments split a style sheet into pieces; it is checked as one.
		if (closed?.style) closed.drawn.refs.push(...checkCss(closed.style.join(''), 'a <style> element'));
	};

	// One write: sax checks its buffer limits once per write, and an embedded image's data URL
	// is one long attribute value.
	parser.write(text).close();
	if (!root) throw notAnImage();

	const drawn = countDrawn(root, byId);
	if (drawn.elements > MAX_SVG_DRAWN_ELEMENTS) throw tooManyDrawn();
	if (drawn.pixels > limits.maxPixels)
		throw new ArtRejected(
			'too-many-pixels',
			`The images embedded in this SVG add up to ${megapixels(drawn.pixels)} as drawn (counting each reuse); ` +
				`Paddock accepts up to ${megapixels(limits.maxPixels)}.`
		);

	return { ...svgSizePx(rootAttributes), embeddedImages };
}

interface Reference {
	fragment?: string;
	pixels?: number;
}

/**
 * `href`/`xlink:href`/`src`: a `#fragment` inside this file, or an embedded PNG or JPEG as a
 * base64 data URL (RFC 2397), whose header must pass the pixel cap before anything decodes it.
 */
function checkReference(value: string, where: string, limits: SvgLimits): Reference {
	const target = value.replace(/^[\u0000-\u0020]+|[\u0000-\u0020]+$/g, '');
	if (target === '') return {};
	if (target.startsWith('#')) return { fragment: target.slice(1) };
	const data = /^data:image\/(png|jpeg);base64,/i.exec(target);
	if (!data) {
		if (/^data:/i.test(target))
			throw unsafe(`embedded data of another kind (${where} = ${quote(target)}); only PNG and JPEG may be embedded`);
		throw unsafe(`a link to an outside file (${where} = ${quote(target)})`);
	}
	const base64 = target.slice(data[0].length).replace(/[\t\n\r ]+/g, '');
	if (!/^[A-Za-z0-9+/]*={0,2}$/.test(base64) || base64.length % 4 === 1)
		throw new ArtRejected('unreadable', `An image embedded in this SVG is damaged: its base64 data is not valid (${where}).`);
	const bytes = new Uint8Array(Buffer.from(base64, 'base64'));
	const isJpeg = bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff;
	if (!isPng(bytes) && !isJpeg) throw unsafe(`an embedded image that is not really a PNG or JPEG (${where})`);
	let size: { width: number; height: number };
	try {
		size = imageSize(bytes);
	} catch {
		throw new ArtRejected('no-size', `An image embedded in this SVG has no readable width and height (${where}).`);
	}
	if (!(size.width > 0) || !(size.height > 0))
		throw new ArtRejected('no-size', `An image embedded in this SVG has no readable width and height (${where}).`);
	const pixels = size.width * size.height;
	if (pixels > limits.maxPixels)
		throw new ArtRejected(
			'too-many-pixels',
			`An image embedded in this SVG is ${size.width} × ${size.height} px (${megapixels(pixels)}); ` +
				`Paddock accepts up to ${megapixels(limits.maxPixels)}. Scale it down and export again.`
		);
	return { pixels };
}

/**
 * CSS in a `style` attribute, a presentation attribute or a `<style>` element: refuse
 * `@import` and any url()/image-set()-style load of something other than a `#fragment`.
 * Comments and escapes are undone first (CSS Syntax Level 3 §4.3.7), so `u\72l(` is still url(.
 * Returns the fragments referenced.
 */
function checkCss(css: string, where: string): string[] {
	if (!/[\\@(]/.test(css)) return [];
	const plain = css
		.replace(/\/\*[\s\S]*?\*\//g, '')
		.replace(/\\([0-9a-fA-F]{1,6})[ \t\n\r\f]?/g, (_, hex: string) => {
			const code = parseInt(hex, 16);
			return code > 0 && code <= 0x10ffff ? String.fromCodePoint(code) : '\ufffd';
		})
		.replace(/\\\r?\n/g, '')
		.replace(/\\(.)/g, '$1');
	const lower = plain.toLowerCase();
	if (lower.includes('@import')) throw unsafe(`a style sheet import (@import in ${where})`);
	// A function token is its name immediately followed by "(" (CSS Syntax Level 3 §4.3.4).
	const loader = /(?:^|[^a-z0-9_-])(?:-[a-z]+-)?(image-set|cross-fade|image|src)\(/.exec(lower);
	if (loader) throw unsafe(`a CSS ${loader[1]}() that loads an image by address (in ${where})`);
	const fragments: string[] = [];
	for (const match of plain.matchAll(/url\(\s*(?:"([^"]*)"|'([^']*)'|([^)]*))/gi)) {
		const target = (match[1] ?? match[2] ?? match[3] ?? '').trim();
		if (target === '') continue;
		if (!target.startsWith('#')) throw unsafe(`a style that loads an outside file (url(${quote(target)}) in ${where})`);
		fragments.push(target.slice(1));
	}
	return fragments;
}

/**
 * Elements and embedded pixels as a renderer draws them: each reference draws its target again,
 * so nested `<use>` fan-out ("billion laughs" in geometry) is counted, not suffered.
 * A reference back into itself is never drawn by renderers and counts nothing here.
 */
function countDrawn(root: Drawn, byId: Map<string, Drawn>): { elements: number; pixels: number } {
	const memo = new Map<Drawn, { elements: number; pixels: number }>();
	const visiting = new Set<Drawn>();
	const visit = (node: Drawn, depth: number): { elements: number; pixels: number } => {
		const known = memo.get(node);
		if (known) return known;
		if (visiting.has(node)) return { elements: 0, pixels: 0 };
		if (depth > MAX_REFERENCE_DEPTH) throw unsafe(`references nested more than ${MAX_REFERENCE_DEPTH} deep`);
		visiting.add(node);
		let elements = 1;
		let pixels = node.pixels;
		const add = (next: Drawn) => {
			const counted = visit(next, depth + 1);
			elements += counted.elements;
			pixels += counted.pixels;
			// Stop early: the totals can grow exponentially.
			if (elements > MAX_SVG_DRAWN_ELEMENTS) throw tooManyDrawn();
		};
		for (const child of node.children) add(child);
		for (const id of node.refs) {
			const target = byId.get(id);
			if (target) add(target);
		}
		visiting.delete(node);
		const counted = { elements, pixels };
		memo.set(node, counted);
		return counted;
	};
	return visit(root, 0);
}

/**
 * The picture's size from the root's width/height, else its viewBox (SVG 1.1 §7.7 and §7.10):
 * a length with no unit is px; relative lengths (%, em, ex) fall back to the viewBox.
 */
function svgSizePx(attributes: QualifiedTag['attributes']): { widthPx: number; heightPx: number } {
	const viewBox = parseViewBox(attributes.viewBox?.value);
	let width = parseLengthPx(attributes.width?.value);
	let height = parseLengthPx(attributes.height?.value);
	if (width === undefined && height === undefined && viewBox) [width, height] = [viewBox.width, viewBox.height];
	else if (width === undefined && height !== undefined && viewBox) width = (height * viewBox.width) / viewBox.height;
	else if (height === undefined && width !== undefined && viewBox) height = (width * viewBox.height) / viewBox.width;
	if (width === undefined || height === undefined || !(width > 0) || !(height > 0) || !Number.isFinite(width * height))
		throw new ArtRejected(
			'no-size',
			'This SVG has no usable size: give its root element a viewBox, or a width and height above zero.'
		);
	return { widthPx: Math.max(1, Math.round(width)), heightPx: Math.max(1, Math.round(height)) };
}

function parseLengthPx(value: string | undefined): number | undefined {
	const match = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)\s*([a-z%]*)\s*$/i.exec(value ?? '');
	if (!match) return undefined;
	const perUnit = PX_PER_UNIT[match[2].toLowerCase() || 'px'];
	return perUnit === undefined ? undefined : Number(match[1]) * perUnit;
}

function parseViewBox(value: string | undefined): { width: number; height: number } | undefined {
	if (!value) return undefined;
	const numbers = value.trim().split(/[\s,]+/).map(Number);
	if (numbers.length !== 4 || numbers.some((n) => !Number.isFinite(n))) return undefined;
	const [, , width, height] = numbers;
	return width > 0 && height > 0 ? { width, height } : undefined;
}
