import { describe, expect, it } from 'vitest';
import { formatDay, formatMoment, readerLocale } from './dates';

// 3 December 2026 14:05 UTC: a day and month that read two ways when written as numbers.
const AT = new Date(Date.UTC(2026, 11, 3, 14, 5));

describe('dates', () => {
	it('writes the month as a word in every language, so no date reads two ways', () => {
		for (const locale of ['en-US', 'en-GB', 'de-DE', 'fr-FR', 'es-ES', 'nl-NL']) {
			const text = formatMoment(AT, { locale, timeZone: 'UTC' });
			// Never day and month both as numbers (12/3/2026, 3.12.2026, 03-12-2026).
			expect(text, locale).not.toMatch(/\b\d{1,2}[./-]\d{1,2}[./-]\d{2,4}\b/);
			expect(text, locale).toContain('2026');
			expect(text, locale).toMatch(/UTC/);
		}
	});

	it('agrees with the platform formatter (ECMA-402) for the same options', () => {
		const reference = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' }).format(AT);
		expect(formatDay(AT, { locale: 'en-GB', timeZone: 'UTC' })).toBe(reference);
		expect(formatDay(AT, { locale: 'en-GB', timeZone: 'UTC' })).toBe('3 Dec 2026');
		expect(formatMoment(AT, { locale: 'en-GB', timeZone: 'UTC' })).toMatch(/^3 Dec 2026,? 14:05 UTC$/);
	});

	it('shows the moment in the zone asked for', () => {
		expect(formatMoment(AT, { locale: 'en-GB', timeZone: 'Asia/Tokyo' })).toMatch(/^3 Dec 2026,? 23:05 /);
	});

	it("takes the reader's language from Accept-Language by its weights (RFC 9110 §12.5.4)", () => {
		expect(readerLocale('de-DE,de;q=0.9,en;q=0.8')).toBe('de-DE');
		expect(readerLocale('en;q=0.5, fr-FR')).toBe('fr-FR');
		expect(readerLocale('*')).toBeUndefined();
		expect(readerLocale('')).toBeUndefined();
		expect(readerLocale(null)).toBeUndefined();
		expect(readerLocale('not a tag!!, en-GB;q=0.3')).toBe('en-GB');
		expect(readerLocale('x;q=0')).toBeUndefined();
	});
});
