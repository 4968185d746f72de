/**
 * Every form post is checked here before any action or route reads it: a field (or a file's
 * name) holding a control character answers 400 naming the field, so nothing is stored.
 *
 * Text forms are read in full from a copy of the body (they are small). A large multipart body
 * is a file upload and is not copied: its readers go through `request.formData()`, which this
 * hook wraps with the same check, or through `checkedForm` (the art upload's capped reader).
 */
import { error, json, type Handle } from '@sveltejs/kit';
import { controlCharacterInForm, controlCharacterMessage } from '../text-input';
import { apiError } from './api';

/** Forms up to this size are read whole for the check; larger ones are uploads. */
const TEXT_FORM_BYTES = 1024 * 1024;

/** The form as read, or a refusal naming the first field with a control character. */
export function checkedForm(form: FormData): FormData {
	const found = controlCharacterInForm(form);
	if (found) error(400, controlCharacterMessage(found));
	return form;
}

export const refuseControlCharacters: Handle = async ({ event, resolve }) => {
	const request = event.request;
	const type = request.headers.get('content-type') ?? '';
	const isForm = type.startsWith('application/x-www-form-urlencoded') || type.startsWith('multipart/form-data');
	if (!isForm || request.method === 'GET' || request.method === 'HEAD') return resolve(event);
	const declared = Number(request.headers.get('content-length') ?? NaN);
	if (type.startsWith('application/x-www-form-urlencoded') || declared <= TEXT_FORM_BYTES) {
		let found: string | null = null;
		try {
			found = controlCharacterInForm(await request.clone().formData());
		} catch {
			// A body that is no form at all: its reader answers for it.
		}
		if (found) return refusal(event.url.pathname, request.headers, controlCharacterMessage(found));
	} else {
		const read = request.formData.bind(request);
		request.formData = async () => checkedForm(await read());
	}
	return resolve(event);
};

/** The 400 in the form its caller reads: API JSON, a form action's result, or the error page. */
function refusal(path: string, headers: Headers, message: string): Response {
	if (path.startsWith('/api/')) return apiError(400, message);
	if (headers.get('x-sveltekit-action') === 'true') return json({ type: 'error', status: 400, error: { message } }, { status: 400 });
	error(400, message);
}
