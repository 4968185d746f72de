/** One clock for server and browser, so a page reads the same wherever it was drawn. */
const format = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });

export const when = (d: Date | string) => `${format.format(new Date(d))} UTC`;
