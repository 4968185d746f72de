/**
 * A small browser for integration tests: requests go through the app's real `handle` hook (Auth.js
 * and all), with a cookie jar, a client address of its own and the framework's cookie defaults,
 * so sign-in, sign-out and session checks run as they do in the server.
 */
import type { RequestEvent } from '@sveltejs/kit';
import { handlers } from '../../src/hooks.server';

/** The hooks in order, as the framework's `sequence` runs them (which needs the server's request store). */
function chain(event: RequestEvent, resolve: (e: RequestEvent) => Promise<Response>, i = 0): Promise<Response> {
	if (i === handlers.length) return resolve(event);
	return Promise.resolve(handlers[i]({ event, resolve: (e) => chain(e, resolve, i + 1) }));
}

export interface CookieSet {
	name: string;
	value: string;
	secure: boolean;
	httpOnly: boolean;
	sameSite: string;
	maxAge?: number;
	expires?: Date;
}

export interface Answer {
	status: number;
	location: string | null;
	body: string;
	/** Who the app took the caller to be (for requests the app itself answers). */
	user: { id: string; email: string } | null;
	sessionId?: string;
}

function parseSetCookie(header: string): CookieSet {
	const [pair, ...attrs] = header.split(';').map((p) => p.trim());
	const eq = pair.indexOf('=');
	const c: CookieSet = { name: pair.slice(0, eq), value: decodeURIComponent(pair.slice(eq + 1)), secure: false, httpOnly: false, sameSite: '' };
	for (const a of attrs) {
		const [k, v = ''] = a.split('=');
		const key = k.toLowerCase();
		if (key === 'secure') c.secure = true;
		else if (key === 'httponly') c.httpOnly = true;
		else if (key === 'samesite') c.sameSite = v.toLowerCase();
		else if (key === 'max-age') c.maxAge = Number(v);
		else if (key === 'expires') c.expires = new Date(v);
	}
	return c;
}

export class TestBrowser {
	jar = new Map<string, string>();
	/** Every cookie the app set, with the flags a browser would receive. */
	sets: CookieSet[] = [];

	constructor(
		public socketAddress = '203.0.113.10',
		public origin = 'http://paddock.example',
		public extraHeaders: Record<string, string> = {}
	) {}

	private keep(c: CookieSet) {
		this.sets.push(c);
		const gone = c.value === '' || c.maxAge === 0 || (c.expires && c.expires.getTime() < Date.now());
		if (gone) this.jar.delete(c.name);
		else this.jar.set(c.name, c.value);
	}

	cookieHeader() {
		return [...this.jar].map(([k, v]) => `${k}=${encodeURIComponent(v)}`).join('; ');
	}

	async request(path: string, init: { method?: string; form?: Record<string, string>; headers?: Record<string, string> } = {}): Promise<Answer> {
		const url = new URL(path, this.origin);
		const headers = new Headers({ ...this.extraHeaders, ...init.headers, 'user-agent': 'TestBrowser/1.0' });
		if (this.jar.size) headers.set('cookie', this.cookieHeader());
		let body: string | undefined;
		if (init.form) {
			headers.set('content-type', 'application/x-www-form-urlencoded');
			headers.set('origin', url.origin);
			body = new URLSearchParams(init.form).toString();
		}
		const request = new Request(url, { method: init.method ?? (body ? 'POST' : 'GET'), headers, body });
		const browser = this;
		const event = {
			request,
			url,
			params: {},
			route: { id: null },
			locals: {} as App.Locals,
			cookies: {
				get: (n: string) => browser.jar.get(n),
				getAll: () => [...browser.jar].map(([name, value]) => ({ name, value })),
				// The framework's own default: Secure unless the host is localhost on http.
				set: (name: string, value: string, o: Record<string, unknown> = {}) =>
					browser.keep({
						name,
						value,
						secure: (o.secure as boolean | undefined) ?? !(url.hostname === 'localhost' && url.protocol === 'http:'),
						httpOnly: (o.httpOnly as boolean | undefined) ?? true,
						sameSite: String(o.sameSite ?? 'lax').toLowerCase(),
						maxAge: o.maxAge as number | undefined,
						expires: o.expires as Date | undefined
					}),
				delete: (name: string) => void browser.jar.delete(name),
				serialize: () => ''
			},
			getClientAddress: () => this.socketAddress,
			setHeaders: () => {},
			fetch,
			platform: undefined,
			isDataRequest: false,
			isSubRequest: false,
			isRemoteRequest: false,
			tracing: { enabled: false, root: {}, current: {} }
		};
		let seen: Pick<Answer, 'user' | 'sessionId'> = { user: null };
		// eslint-disable-next-line @typescript-eslint/no-explicit-any
		const response = await chain(event as any, async (e) => {
			seen = { user: e.locals.user, sessionId: e.locals.sessionId };
			return new Response('ok');
		});
		for (const h of response.headers.getSetCookie()) this.keep(parseSetCookie(h));
		return { status: response.status, location: response.headers.get('location'), body: await response.text(), ...seen };
	}

	/** Signs in by posting straight to Auth.js's credentials callback, as any script could. */
	async postCredentials(email: string, password: string): Promise<Answer> {
		return this.request('/auth/callback/credentials', { form: { email, password, callbackUrl: '/' } });
	}

	/** Auth.js's own sign-out endpoint (the app's sign-out form calls the same code). */
	async signOut(): Promise<Answer> {
		return this.request('/auth/signout', { form: { callbackUrl: '/' } });
	}

	/** Who the app sees on an ordinary page request. */
	async whoAmI() {
		return (await this.request('/account')).user?.email ?? null;
	}
}
