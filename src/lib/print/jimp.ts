/**
 * jimp, loaded when a file first needs it: JPEGs, interlaced PNGs, thumbnails and soft proofs.
 * Loaded at start it would cost every process some 13 MB of heap and 38 MB of resident memory
 * (each of its plugins brings its own copy of a schema library), and a server that only serves
 * pages and prints sheets never decodes a JPEG. Required, not imported: the compiled CLI runs from
 * a V8 code cache, where import() is not available.
 */
import { createRequire } from 'node:module';

type JimpModule = typeof import('jimp');

let loaded: JimpModule | undefined;

export function jimp(): JimpModule['Jimp'] {
	loaded ??= createRequire(import.meta.url)('jimp') as JimpModule;
	return loaded.Jimp;
}
