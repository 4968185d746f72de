/**
 * The names of the files people download: what game, which version and day, and what is inside,
 * read from the name alone (never an internal id). Only a-z, 0-9, '-', '_' and '.', so every
 * operating system, zip tool and e-mail client keeps the name as it is.
 *
 *   marrowbed-derby_proof-3_2026-12-03_sheets-a4.pdf
 *   marrowbed-derby_proof-3_2026-12-03_movement-cards_rosehip-2.pdf
 *   marrowbed-derby_working-copy-v14_2026-12-03_card-faces-300dpi.zip
 *
 * Dates are ISO 8601 (year-month-day): one reading everywhere, and names sort by date.
 */

/** A name as a file-name part: accents dropped, lower case, anything else a hyphen. */
export function fileSlug(text: string, fallback = 'file'): string {
	return (
		text
			.normalize('NFKD')
			.replace(/[\u0300-\u036f]/g, '')
			.toLowerCase()
			.replace(/[^a-z0-9]+/g, '-')
			.replace(/^-+|-+$/g, '')
			.slice(0, 60)
			.replace(/-+$/, '') || fallback
	);
}

export interface DownloadOf {
	gameName: string;
	/** "proof 3" or "working copy v14". */
	version: string;
	/** YYYY-MM-DD: the proof's day, or the day of the build for the working copy. */
	date: string;
}

/** What every download of one version starts with: game, version, day. */
export const downloadStem = (d: DownloadOf) => `${fileSlug(d.gameName, 'game')}_${fileSlug(d.version, 'version')}_${d.date}`;

export const sheetsFileName = (d: DownloadOf, paper: string) => `${downloadStem(d)}_sheets-${fileSlug(paper, 'paper')}.pdf`;

export const pressFileName = (d: DownloadOf, kindName: string, cardName: string) =>
	`${downloadStem(d)}_${fileSlug(kindName, 'cards')}_${fileSlug(cardName, 'card')}.pdf`;

export const pngZipFileName = (d: DownloadOf, dpi: number) => `${downloadStem(d)}_card-faces-${dpi}dpi.zip`;

/**
 * One file-name part per item from its name, unique among the items: the second "Rosehip" is
 * "rosehip-2" unless that is taken too. Keyed by the item's id.
 */
export function uniqueFileParts(items: { id: string; name: string }[], fallback: string): Map<string, string> {
	const taken = new Set<string>();
	const parts = new Map<string, string>();
	for (const item of items) {
		const base = fileSlug(item.name, fallback);
		let part = base;
		for (let n = 2; taken.has(part); n++) part = `${base}-${n}`;
		taken.add(part);
		parts.set(item.id, part);
	}
	return parts;
}
