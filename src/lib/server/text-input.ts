/**
 * Text people send may not carry control characters: the database refuses NUL outright, and the
 * others (escape sequences, form feeds, backspaces) only hide or garble what others read. Tab,
 * line feed and carriage return stay allowed: comments, notes and card text run over lines.
 * One rule for JSON bodies (readJson) and form posts (the form-text hook).
 */
import { parse } from 'devalue';

/** C0 controls and DEL, tab, line feed and carriage return aside. */
export const CONTROL_CHARACTER = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/;

export const controlCharacterMessage = (where: string) => `${where}: text may not contain control characters (tab and line breaks aside)`;

/** The path of the first string (or key) in a JSON-like value holding a control character, if any. */
export function controlCharacterIn(value: unknown, path = 'body'): string | null {
	if (typeof value === 'string') return CONTROL_CHARACTER.test(value) ? path : null;
	if (Array.isArray(value)) {
		for (let i = 0; i < value.length; i++) {
			const found = controlCharacterIn(value[i], `${path}.${i}`);
			if (found) return found;
		}
		return null;
	}
	if (value instanceof Map || value instanceof Set) return controlCharacterIn([...value], path);
	if (value && typeof value === 'object' && !(value instanceof Date)) {
		for (const [k, v] of Object.entries(value)) {
			if (CONTROL_CHARACTER.test(k)) return `${path} (a key)`;
			const found = controlCharacterIn(v, path === 'body' ? k : `${path}.${k}`);
			if (found) return found;
		}
	}
	return null;
}

/** Forms that post their data as one serialised value (`dataType: 'json'`) carry it in this field. */
const SERIALISED_FIELD = '__superform_json';

/** The first field of a posted form holding a control character (in its value, name or file name), if any. */
export function controlCharacterInForm(form: FormData): string | null {
	for (const [name, value] of form) {
		if (CONTROL_CHARACTER.test(name)) return 'a field name';
		if (typeof value === 'string') {
			if (name !== SERIALISED_FIELD && CONTROL_CHARACTER.test(value)) return name;
		} else if (CONTROL_CHARACTER.test(value.name)) return `${name} (the file name)`;
	}
	const serialised = form.getAll(SERIALISED_FIELD).filter((v) => typeof v === 'string');
	if (serialised.length) {
		let data: unknown;
		try {
			data = parse(serialised.join(''));
		} catch {
			// Not ours to judge: the form's own reader refuses a damaged value.
			return null;
		}
		const found = controlCharacterIn(data);
		return found === 'body' ? 'the form' : found;
	}
	return null;
}
