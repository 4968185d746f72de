/**
 * Card faces are standalone SVG documents; the preview puts two of them (front and back) into
 * one page. Ids in an HTML document are shared, so each face's ids (clip paths, groups) get a
 * prefix of their own, or the back would clip its art with the front's clip path.
 */
export function scopeSvgIds(svg: string, prefix: string): string {
	return svg
		.replace(/\bid="([^"]+)"/g, (_, id: string) => `id="${prefix}-${id}"`)
		.replace(/url\(#([^)]+)\)/g, (_, id: string) => `url(#${prefix}-${id})`)
		.replace(/\bhref="#([^"]+)"/g, (_, id: string) => `href="#${prefix}-${id}"`);
}
