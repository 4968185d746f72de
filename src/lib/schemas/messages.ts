/**
 * What people read when a form refuses input, and how a form answers a save. One error map for
 * every schema (forms, API, imports): plain words saying what to do, never the library's
 * wording. A schema's own message (a regex's hint, say) still wins over these.
 */
import { z } from 'zod';
import type { $ZodRawIssue } from 'zod/v4/core';

/** A form's answer: a success, a warning (saved, but look at these) or an error (not saved). */
export interface FormNote {
	text: string;
	tone: 'success' | 'warning' | 'error';
	links?: { href: string; label: string }[];
}

const count = (n: number | bigint, one: string, many = `${one}s`) => `${n} ${Number(n) === 1 ? one : many}`;
const orList = (values: readonly unknown[]) =>
	values.length <= 1 ? String(values[0] ?? '') : `${values.slice(0, -1).map(String).join(', ')} or ${String(values.at(-1))}`;

const FORMATS: Record<string, string> = {
	email: 'Enter an e-mail address, such as name@example.com.',
	url: 'Enter a full web address, starting with https://.',
	uuid: 'This is not an id Paddock made; copy it again from its page.',
	regex: 'Use the form the hint shows.',
	datetime: 'Enter a date and time.',
	date: 'Enter a date.'
};

/** Plain words for one issue; undefined leaves zod's own (only for codes we never show). */
export function plainMessage(issue: $ZodRawIssue): string | undefined {
	switch (issue.code) {
		case 'invalid_type':
			if (issue.input === undefined || issue.input === null || issue.input === '')
				return issue.expected === 'number' || issue.expected === 'int' ? 'Enter a number.' : 'Fill this in.';
			if (issue.expected === 'int') return 'Enter a whole number.';
			if (issue.expected === 'number') return 'Enter a number.';
			// Only a JSON body can send a number or a list where text belongs.
			if (issue.expected === 'string') return 'Give this as text, in quotes.';
			if (issue.expected === 'boolean') return 'Choose yes or no.';
			if (issue.expected === 'array') return 'Give a list here.';
			return 'This value is of the wrong sort for this field.';
		case 'too_small': {
			const n = issue.minimum;
			if (issue.origin === 'string')
				return Number(n) <= 1 ? 'Fill this in.' : issue.exact ? `Use exactly ${count(n, 'character')}.` : `Use at least ${count(n, 'character')}.`;
			if (issue.origin === 'array' || issue.origin === 'set') return Number(n) <= 1 ? 'Add at least one.' : `Add at least ${n}.`;
			if (issue.origin === 'date') return 'Choose a later date.';
			return issue.inclusive === false ? `Use a number above ${n}.` : `Use ${n} or more.`;
		}
		case 'too_big': {
			const n = issue.maximum;
			if (issue.origin === 'string') return issue.exact ? `Use exactly ${count(n, 'character')}.` : `Keep it to ${count(n, 'character')} or fewer.`;
			if (issue.origin === 'array' || issue.origin === 'set') return `Keep it to ${n} or fewer.`;
			if (issue.origin === 'date') return 'Choose an earlier date.';
			return issue.inclusive === false ? `Use a number below ${n}.` : `Use ${n} or less.`;
		}
		case 'invalid_format':
			return FORMATS[issue.format] ?? 'Check the form of this value.';
		case 'not_multiple_of':
			return `Use a multiple of ${issue.divisor}.`;
		case 'invalid_value':
			return `Choose ${orList(issue.values)}.`;
		case 'unrecognized_keys':
			return issue.keys.length === 1
				? `“${issue.keys[0]}” is not a field here; remove it.`
				: `${issue.keys.map((k) => `“${k}”`).join(', ')} are not fields here; remove them.`;
		case 'invalid_union':
			return 'This value matches none of the accepted forms.';
		default:
			return undefined;
	}
}

let installed = false;
/** Installs the map for every schema in this process (server) or page (browser). Safe to call twice. */
export function usePlainMessages() {
	if (installed) return;
	installed = true;
	z.config({ customError: plainMessage });
}

usePlainMessages();
