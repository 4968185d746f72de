/**
 * Why an upload was refused, in words for the person who uploaded it, with the HTTP status the
 * upload route should answer with (413 for a file over the size cap, 400 for everything else).
 */

export type ArtRejectionReason =
	/** Over the byte cap. */
	| 'too-large'
	/** Not a PNG, JPEG or SVG, whatever its name or declared type says. */
	| 'not-an-image'
	/** Header says more pixels than the cap: refused before any decode. */
	| 'too-many-pixels'
	/** Zero, missing or unreadable width or height. */
	| 'no-size'
	/** An SVG with scripts, outside links, entity declarations or other active content. */
	| 'unsafe-svg'
	/** The right kind of file, but broken: it cannot be parsed or decoded. */
	| 'unreadable';

export class ArtRejected extends Error {
	readonly status: 400 | 413;
	readonly reason: ArtRejectionReason;

	constructor(reason: ArtRejectionReason, message: string) {
		super(message);
		this.name = 'ArtRejected';
		this.reason = reason;
		this.status = reason === 'too-large' ? 413 : 400;
	}
}
