/**
 * jimp, loaded when a file first needs it: a JPEG or an interlaced PNG to decode. Loaded at start
 * it cost the server 11 MB of heap and 12 to 18 MB of resident memory at rest (each of its plugins
 * brings its own copy of a schema library), and a server that only serves pages and prints sheets
 * never decodes a JPEG. Required, not imported: the compiled CLI runs from a V8 code cache, where
 * import() is not available.
 */
import { createRequire } from 'node:module';

type JimpModule = typeof import('jimp');

let loaded: JimpModule | undefined;

export function jimp(): JimpModule['Jimp'] {
	loaded ??= createRequire(import.meta.url)('jimp') as JimpModule;
	return loaded.Jimp;
}
