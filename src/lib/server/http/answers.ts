/**
 * The one place where a refusal becomes an HTTP status: the services' reasons, the engine's own
 * refusals (bad print options, a full print pool, a refused art file, a bad bundle) and a store
 * out of reach. The JSON API, form actions and page loads all ask here.
 */
import { error } from '@sveltejs/kit';
import { Busy, Refusal, type RefusalReason } from '../refusals';
import { StorageMissingError, StorageUnavailableError } from '../storage/store';
import { ArtRejected } from '$lib/art/rejected';
import { BundleError } from '$lib/game/bundle';
import { PrintBusyError } from '$lib/print/pool';
import { PrintOptionsError } from '$lib/print/options';
import { RaceSetupError } from '$lib/odds/race';
import { IccError } from '$lib/print/colour/icc';

/** The statuses a refusal answers with (form actions need them as a range). */
type RefusedStatus = 400 | 401 | 403 | 404 | 409 | 410 | 413 | 415 | 429 | 503;

export const STATUS: Record<RefusalReason, RefusedStatus> = {
	'sign-in': 401,
	'not-found': 404,
	'not-allowed': 403,
	conflict: 409,
	gone: 410,
	invalid: 400,
	'too-large': 413,
	unreadable: 415,
	'too-many': 429,
	busy: 503
};

export interface Answer {
	status: RefusedStatus;
	message: string;
	code?: string;
	details?: unknown;
	/** A busy answer's time to come back, seconds. */
	retryAfterS?: number;
}

/** The status and message for a refusal; null for anything else (a fault: 500). */
export function answerFor(e: unknown): Answer | null {
	if (e instanceof Busy && e.retryAfterS) return { status: 503, message: e.message, code: e.code, retryAfterS: e.retryAfterS };
	if (e instanceof Refusal) return { status: STATUS[e.reason], message: e.message, code: e.code, details: e.details };
	if (e instanceof ArtRejected) return { status: e.reason === 'too-large' ? 413 : 400, message: e.message };
	if (e instanceof PrintBusyError) return { status: 503, message: e.message, code: 'busy' };
	if (e instanceof StorageUnavailableError) return { status: 503, message: e.message };
	if (e instanceof StorageMissingError) return { status: 404, message: e.message };
	if (e instanceof BundleError) return { status: 400, message: e.message, code: 'bad_bundle' };
	if (e instanceof PrintOptionsError) return { status: e.status === 404 ? 404 : 400, message: e.message };
	if (e instanceof RaceSetupError || e instanceof IccError) return { status: 400, message: e.message };
	return null;
}

/** For page loads: a refusal as SvelteKit's error page with its status; anything else rethrown. */
export function refusedPage(e: unknown): never {
	const answer = answerFor(e);
	if (answer) error(answer.status, answer.message);
	throw e;
}
