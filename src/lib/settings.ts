/**
 * Whole-number settings read from the environment (worker counts, queue bounds, seconds). An
 * unset, empty or unusable value ('0', '-2', '1.5', 'many') takes the default instead of
 * becoming NaN: a mistyped PADDOCK_SWEEP_SECONDS must not mean a sweep every millisecond.
 */
export function countSetting(raw: string | undefined, fallback: number): number {
	const n = raw === undefined || raw.trim() === '' ? NaN : Number(raw);
	return Number.isInteger(n) && n >= 1 ? n : fallback;
}
