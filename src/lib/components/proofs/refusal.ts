/** How an API refusal reads on the page: its message, without the field path the API puts first. */
import { ApiFailure } from '$lib/client/api';

export function refusal(e: unknown): string {
	if (e instanceof ApiFailure) return e.message.replace(/^[a-zA-Z]+: /, '');
	if (e instanceof TypeError) return 'The server could not be reached. Check the connection and try again.';
	return e instanceof Error ? e.message : String(e);
}
