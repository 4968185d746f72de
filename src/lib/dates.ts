/**
 * The one way Paddock writes a date or a moment: the platform's own formatter (Intl.DateTimeFormat,
 * ECMA-402) in the reader's language, with the month as a word so no date reads two ways
 * (12/3/2026 is 3 December in one country and 12 March in another).
 *
 * Pages are drawn twice, on the server and in the browser. The server knows the reader's language
 * (Accept-Language) but not their time zone, so it writes UTC and says so; once the page runs in
 * the browser, `<When>` switches to the reader's own zone.
 */

export interface DateStyle {
	/** A BCP 47 language tag; the platform's default when absent. */
	locale?: string;
	/** An IANA zone; the platform's own zone when absent. */
	timeZone?: string;
}

const MOMENT: Intl.DateTimeFormatOptions = {
	day: 'numeric',
	month: 'short',
	year: 'numeric',
	hour: '2-digit',
	minute: '2-digit',
	timeZoneName: 'short'
};
const DAY: Intl.DateTimeFormatOptions = { day: 'numeric', month: 'short', year: 'numeric' };

const formatters = new Map<string, Intl.DateTimeFormat>();
function formatter(kind: 'moment' | 'day', style: DateStyle): Intl.DateTimeFormat {
	const key = `${kind} ${style.locale ?? ''} ${style.timeZone ?? ''}`;
	let f = formatters.get(key);
	if (!f) {
		f = new Intl.DateTimeFormat(style.locale, { ...(kind === 'moment' ? MOMENT : DAY), timeZone: style.timeZone });
		formatters.set(key, f);
	}
	return f;
}

/** A moment: day, month as a word, year, time and zone ("3 Dec 2026, 14:05 UTC" in British English). */
export function formatMoment(at: Date | string | number, style: DateStyle = {}): string {
	return formatter('moment', style).format(new Date(at));
}

/** A day: day, month as a word, year ("3 Dec 2026"); for dates where the time does not matter. */
export function formatDay(at: Date | string | number, style: DateStyle = {}): string {
	return formatter('day', style).format(new Date(at));
}

/** The reader's first language from an Accept-Language header (RFC 9110 §12.5.4) that the platform can format, or undefined. */
export function readerLocale(header: string | null | undefined): string | undefined {
	if (!header) return undefined;
	const tags = header
		.split(',')
		.map((part) => {
			const [tag, ...params] = part.trim().split(';');
			const q = params.map((p) => p.trim()).find((p) => p.startsWith('q='));
			return { tag: tag.trim(), q: q ? Number(q.slice(2)) : 1 };
		})
		.filter((t) => t.tag && t.tag !== '*' && t.q > 0 && /^[A-Za-z]{2,8}(-[A-Za-z0-9]{1,8})*$/.test(t.tag))
		.sort((a, b) => b.q - a.q);
	for (const { tag } of tags) {
		try {
			const [supported] = Intl.DateTimeFormat.supportedLocalesOf(tag);
			if (supported) return supported;
		} catch {
			// A malformed tag: try the next one.
		}
	}
	return undefined;
}
