/**
 * Reading an object's past versions: its fields as flat `path → value` pairs, and which of them
 * changed from one version to the next. Arrays of plain values read as one field; arrays of
 * objects (table rows, steps) go one level in, so "rows.3.coins" says which row changed.
 */

export type FieldValue = string | number | boolean | null;

const MAX_DEPTH = 4;

/** The object's fields as `path → value`, in the object's own order. */
export function flattenFields(value: unknown, prefix = '', depth = 0, out = new Map<string, FieldValue>()): Map<string, FieldValue> {
	if (value === null || value === undefined || typeof value !== 'object') {
		if (prefix) out.set(prefix, value === undefined ? null : (value as FieldValue));
		return out;
	}
	if (depth >= MAX_DEPTH || (Array.isArray(value) && value.every((v) => v === null || typeof v !== 'object'))) {
		if (prefix) out.set(prefix, JSON.stringify(value));
		return out;
	}
	const entries = Array.isArray(value) ? value.map((v, i) => [String(i + 1), v] as const) : Object.entries(value);
	if (entries.length === 0 && prefix) out.set(prefix, Array.isArray(value) ? '[]' : '{}');
	for (const [key, v] of entries) {
		if (key === 'version') continue;
		flattenFields(v, prefix ? `${prefix}.${key}` : key, depth + 1, out);
	}
	return out;
}

export interface FieldChange {
	field: string;
	before: FieldValue | undefined;
	after: FieldValue | undefined;
}

/** The fields that differ between two versions (added, removed or changed), in reading order. */
export function fieldChanges(before: unknown, after: unknown): FieldChange[] {
	const a = flattenFields(before);
	const b = flattenFields(after);
	const fields = [...new Set([...a.keys(), ...b.keys()])];
	return fields
		.filter((f) => a.get(f) !== b.get(f))
		.map((field) => ({ field, before: a.get(field), after: b.get(field) }));
}

/** What people call an object in a list: its name, else its file name, else its id. */
export function objectLabel(data: Record<string, unknown>, fallback: string): string {
	for (const key of ['name', 'fileName'] as const) if (typeof data[key] === 'string' && data[key]) return data[key] as string;
	return fallback;
}
