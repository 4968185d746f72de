import { readerLocale } from '$lib/dates';

/** Every page: whether someone is signed in, and the reader's language for dates (so server and browser agree). */
export const load = async ({ locals, request }) => ({
	signedIn: !!locals.user,
	locale: readerLocale(request.headers.get('accept-language'))
});
