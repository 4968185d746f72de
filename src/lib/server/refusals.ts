/**
 * Why a service says no, in the product's words and nothing of HTTP: the adapters in
 * $lib/server/http turn each reason into a status (see http/answers.ts), form actions into a
 * message on the form.
 */

export type RefusalReason =
	/** Not signed in. */
	| 'sign-in'
	/** No such thing, or not one the caller may know of (another team's game). */
	| 'not-found'
	/** The caller's role may not do this. */
	| 'not-allowed'
	/** The thing changed since the caller read it, or is in a state that forbids this. */
	| 'conflict'
	/** An invitation used or expired. */
	| 'gone'
	/** The input does not fit. */
	| 'invalid'
	/** The input is larger than accepted. */
	| 'too-large'
	/** The input is not in a form we read. */
	| 'unreadable'
	/** Too many of the caller's own runs at once. */
	| 'too-many'
	/** A queue is full or a store is out of reach: try again shortly. */
	| 'busy';

export class Refusal extends Error {
	constructor(
		readonly reason: RefusalReason,
		message: string,
		/** Field errors of invalid input, or the newer object on a conflict. */
		readonly details?: unknown,
		/** A short machine-readable name where clients tell refusals of one reason apart. */
		readonly code?: string
	) {
		super(message);
		this.name = 'Refusal';
	}
}

export class NotFound extends Refusal {
	constructor(message: string) {
		super('not-found', message);
	}
}

export class NotAllowed extends Refusal {
	constructor(message: string) {
		super('not-allowed', message);
	}
}

export class SignInFirst extends Refusal {
	constructor(message = 'Sign in first') {
		super('sign-in', message);
	}
}

/** `current` is the newer object a stale save lost to, so the client can show it. */
export class Conflict extends Refusal {
	constructor(
		message: string,
		readonly current?: unknown
	) {
		super('conflict', message, current === undefined ? undefined : { current });
	}
}

export class Invalid extends Refusal {
	/** `issues`: the field errors, as the client shows them. */
	constructor(message: string, issues?: unknown, code?: string) {
		super('invalid', message, issues, code);
	}
}

export class Busy extends Refusal {
	/** `retryAfterS`: when to try again, if known (an HTTP answer's Retry-After). */
	constructor(
		message: string,
		readonly retryAfterS?: number
	) {
		super('busy', message, undefined, 'busy');
	}
}

export const isRefusal = (e: unknown): e is Refusal => e instanceof Refusal;
