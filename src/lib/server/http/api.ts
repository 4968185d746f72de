/**
 * The JSON API's conventions: errors as `{ error: { code, message } }` with the right status,
 * bodies parsed with a size cap and validated with the thing's zod schema.
 */
import { json, isHttpError, isRedirect, type RequestHandler } from '@sveltejs/kit';
import type { z } from 'zod';
import type { $ZodIssue } from 'zod/v4/core';
import { controlCharacterIn, controlCharacterMessage } from '../text-input';
import { Invalid, Refusal } from '../refusals';
import { answerFor } from './answers';

const CODES: Record<number, string> = {
	400: 'bad_request',
	401: 'unauthenticated',
	403: 'forbidden',
	404: 'not_found',
	405: 'method_not_allowed',
	409: 'conflict',
	410: 'gone',
	413: 'too_large',
	415: 'unsupported_media_type',
	422: 'invalid',
	429: 'too_many_requests',
	500: 'internal',
	503: 'unavailable'
};

/** Seconds a client should wait after a 503 when nothing better is known (a file store out of reach). */
export const RETRY_AFTER_S = 30;

export function apiError(status: number, message: string, code?: string, details?: unknown, retryAfterS = RETRY_AFTER_S) {
	return json(
		{ error: { code: code ?? CODES[status] ?? 'error', message, ...(details ? { details } : {}) } },
		// A refused body may be left unread: close the connection rather than reuse it. A busy
		// server says when to come back (RFC 9110 §10.2.3).
		{ status, headers: status === 413 ? { connection: 'close' } : status === 503 ? { 'retry-after': String(retryAfterS) } : {} }
	);
}

/** Wraps a handler so every failure answers as JSON: refusals with their status, faults as 500. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function api<H extends RequestHandler<any, any>>(handler: H): H {
	return (async (event: Parameters<H>[0]) => {
		try {
			return await handler(event);
		} catch (e) {
			const answer = answerFor(e);
			if (answer) return apiError(answer.status, answer.message, answer.code, answer.details, answer.retryAfterS);
			if (isHttpError(e)) return apiError(e.status, e.body.message);
			if (isRedirect(e)) throw e;
			console.error(e);
			return apiError(500, 'Something went wrong on our side');
		}
	}) as H;
}

export const JSON_LIMIT_BYTES = 1024 * 1024;

/** Reads at most `limit` bytes of the body, refusing larger ones with 413 before reading them all. */
export async function readBody(request: Request, limit: number): Promise<Uint8Array> {
	const declared = Number(request.headers.get('content-length') ?? 'NaN');
	if (declared > limit) throw new Refusal('too-large', `The body is larger than ${limit} bytes`);
	if (!request.body) return new Uint8Array();
	const reader = request.body.getReader();
	const chunks: Uint8Array[] = [];
	let size = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		size += value.byteLength;
		if (size > limit) {
			await reader.cancel();
			throw new Refusal('too-large', `The body is larger than ${limit} bytes`);
		}
		chunks.push(value);
	}
	const out = new Uint8Array(size);
	let at = 0;
	for (const c of chunks) {
		out.set(c, at);
		at += c.byteLength;
	}
	return out;
}

/** Parses a JSON body against a schema; 400 with the field errors when it does not fit. */
export async function readJson<S extends z.ZodType>(request: Request, schema: S): Promise<z.infer<S>> {
	const type = request.headers.get('content-type') ?? '';
	if (!type.includes('application/json')) {
		throw new Refusal('unreadable', 'Send the body as application/json');
	}
	const bytes = await readBody(request, JSON_LIMIT_BYTES);
	let value: unknown;
	try {
		value = JSON.parse(new TextDecoder().decode(bytes));
	} catch {
		throw new Invalid('The body is not valid JSON', undefined, 'malformed_json');
	}
	const control = controlCharacterIn(value);
	if (control) throw new Invalid(controlCharacterMessage(control), undefined, 'invalid');
	const parsed = schema.safeParse(value);
	if (!parsed.success) {
		const issues = closestIssues(parsed.error.issues).map((i) => ({ path: i.path.join('.'), message: i.message }));
		throw new Invalid(issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join('; '), issues, 'invalid');
	}
	return parsed.data;
}

/**
 * A body fitting none of a union's forms is explained by the form it came closest to (fewest
 * issues), so a stray key is named rather than hidden behind "matches none of the forms".
 */
function closestIssues(issues: readonly $ZodIssue[], prefix: PropertyKey[] = []): { path: PropertyKey[]; message: string }[] {
	return issues.flatMap((i) => {
		const path = [...prefix, ...i.path];
		if (i.code !== 'invalid_union' || i.errors.length === 0) return [{ path, message: i.message }];
		const closest = i.errors.reduce((a, b) => (b.length < a.length ? b : a));
		return closestIssues(closest, path);
	});
}
