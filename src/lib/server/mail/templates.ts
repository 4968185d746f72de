/**
 * E-mail texts live in templates/mail/<name>.txt as data: a `Subject:` line, a blank line,
 * then the body, with {{placeholders}}. Messages are plain text and link to the exact page.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';

const cache = new Map<string, string>();

export function renderMail(
	name: string,
	values: Record<string, string>
): { subject: string; text: string } {
	let source = cache.get(name);
	if (source === undefined) {
		source = readFileSync(resolve('templates/mail', `${name}.txt`), 'utf8');
		cache.set(name, source);
	}
	const filled = source.replace(/\{\{(\w+)\}\}/g, (_, key: string) => {
		if (!(key in values)) throw new Error(`Mail template ${name} needs a value for ${key}`);
		return values[key];
	});
	const [head, ...body] = filled.split(/\r?\n\r?\n/);
	const subject = head.replace(/^Subject:\s*/i, '').trim();
	return { subject, text: body.join('\n\n').trim() + '\n' };
}
