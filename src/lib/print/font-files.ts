/**
 * Where the typeface's files are, apart from anything that parses them: a PDF whose faces are
 * all laid out already embeds the files without loading fontkit (see ./fonts.ts).
 */
import type { FontWeight } from './display-list';

export const FONT_FAMILY = 'Roboto Slab';

/** The shipped files, by weight (package paths, resolved by Node or bundled by Vite). */
export const FONT_FILES: Record<FontWeight, string> = {
	regular: '@fontsource/roboto-slab/files/roboto-slab-latin-400-normal.woff2',
	bold: '@fontsource/roboto-slab/files/roboto-slab-latin-700-normal.woff2'
};
