/**
 * Editors that keep their page after a save. The save's answer holds the object as written (with
 * its new version), so the editor's form takes it from the answer and the page puts it in its
 * lists; nothing is loaded again. The form is no longer dirty afterwards, so leaving asks nothing.
 */
import type { ActionResult } from '@sveltejs/kit';

/** superForm options: no reload after a save, and the form keeps what was saved (not its first value). */
export const saveInPlace = { invalidateAll: false, resetForm: false } as const;

/** The object a successful save handed back (the action answers `{ form, saved }`). */
export function savedOf<T>(result: ActionResult): T | undefined {
	if (result.type !== 'success' || !result.data || !('saved' in result.data)) return undefined;
	return result.data.saved as T;
}

/** The list with the saved object in place of its old self, or added at the end when new. */
export function withSaved<T extends { id: string }>(list: readonly T[], saved: T): T[] {
	return list.some((o) => o.id === saved.id) ? list.map((o) => (o.id === saved.id ? saved : o)) : [...list, saved];
}
