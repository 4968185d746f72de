/**
 * The press profile Paddock ships: a CMYK output profile built from FOGRA39 characterisation data
 * (offset on coated paper, ISO 12647-2), kept in templates/icc/ with how it was made and its
 * licence. A printer may upload their own shop's profile instead (see ./icc.ts).
 */
import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { PressProfile } from './cmm';

export const BUILTIN_PRESS_PROFILE_FILE = 'templates/icc/paddock-coated-fogra39.icc';

/**
 * The condition as PDF/X names it: FOGRA39 is registered in the ICC's characterisation data
 * registry (http://www.color.org), which is what print shops' preflight compares against.
 * 330 %: the ink limit the profile was built with (`colprof -l330`, see templates/icc/README.md),
 * within the 300–330 % that is common practice for coated stock.
 */
export const BUILTIN_CONDITION = {
	conditionIdentifier: 'FOGRA39',
	condition: 'Offset printing, ISO 12647-2:2004/Amd 1, coated paper (paper type 1 or 2), 115 g/m²',
	registryName: 'http://www.color.org',
	totalInkLimitPct: 330
} as const;

/** The shipped profile's own description (its ICC `desc` tag). */
export const BUILTIN_PROFILE_NAME = 'Paddock coated FOGRA39 (TAC 330%)';

let builtin: Promise<PressProfile> | undefined;

/** The shipped profile with its condition, read once per process. */
export function builtinPressProfile(): Promise<PressProfile> {
	builtin ??= readFile(resolve(process.cwd(), BUILTIN_PRESS_PROFILE_FILE)).then((b) => ({ ...BUILTIN_CONDITION, icc: new Uint8Array(b) }));
	return builtin;
}
