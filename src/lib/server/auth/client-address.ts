/**
 * Who is on the other end of a request: the client's address and browser, for sign-in limits
 * and the session list. Behind a reverse proxy every request comes from the proxy, so the
 * address is read from the header named in PADDOCK_CLIENT_IP_HEADER when that is set.
 */
import { AsyncLocalStorage } from 'node:async_hooks';

export interface Client {
	address: string;
	userAgent: string;
}

/**
 * The header's last entry: a proxy appends the address it saw, so the entries before it may be
 * whatever the client sent. Set the variable only when a proxy you run sets the header.
 */
export function addressFrom(headers: Headers, header: string | null, socketAddress: () => string): string {
	if (header) {
		const value = headers.get(header);
		const last = value?.split(',').pop()?.trim();
		if (last) return last;
	}
	try {
		return socketAddress();
	} catch {
		return 'unknown';
	}
}

const current = new AsyncLocalStorage<Client>();

/** Runs the rest of the request knowing its client, for code that only sees Auth.js's request. */
export const withClient = <T>(client: Client, run: () => T): T => current.run(client, run);

export const currentClient = (): Client => current.getStore() ?? { address: 'unknown', userAgent: '' };
