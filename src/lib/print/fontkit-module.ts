/**
 * fontkit, loaded on first use and synchronously (pdf-lib asks for shaping synchronously): a
 * process whose faces are all laid out already never starts it. The print CLI's build puts its
 * own version of this module in place, one that finds fontkit inside the CLI's bundle
 * (scripts/build-print.js).
 */
import { createRequire } from 'node:module';
import type fontkitTypes from '@pdf-lib/fontkit';

export type Fontkit = typeof fontkitTypes;

let fontkit: Fontkit | undefined;

export function fontkitModule(): Fontkit {
	return (fontkit ??= createRequire(import.meta.url)('@pdf-lib/fontkit') as Fontkit);
}
