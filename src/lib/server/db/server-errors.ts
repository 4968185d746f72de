/**
 * Why a PostgreSQL server could not be used, in words an operator can act on. The message names
 * the server and the user; the password in DATABASE_URL never appears in it.
 */

/** `host:port/database`, from a postgres:// URL. */
export function serverName(url: string): string {
	try {
		const u = new URL(url);
		const host = u.hostname || u.searchParams.get('host') || 'localhost';
		return `${host}:${u.port || 5432}${u.pathname}`;
	} catch {
		return 'the server in DATABASE_URL (the address could not be read)';
	}
}

function userOf(url: string): string {
	try {
		return decodeURIComponent(new URL(url).username) || '(none given)';
	} catch {
		return '(unknown)';
	}
}

/** pg's errors carry a network code (ECONNREFUSED…) or a PostgreSQL SQLSTATE (28P01…). */
export function describeServerError(url: string, e: unknown): string {
	const err = e as { code?: string; message?: string };
	const where = `the database server at ${serverName(url)}`;
	switch (err.code) {
		case 'ECONNREFUSED':
			return `Cannot reach ${where}: nothing accepts connections there. Is PostgreSQL running, and is DATABASE_URL right?`;
		case 'ENOTFOUND':
		case 'EAI_AGAIN':
			return `Cannot reach ${where}: the host name does not resolve. Check the host in DATABASE_URL.`;
		case 'ETIMEDOUT':
		case 'EHOSTUNREACH':
		case 'ENETUNREACH':
			return `Cannot reach ${where}: the connection timed out. Check the host, the port and any firewall.`;
		case '28P01':
		case '28000':
			return `${capital(where)} refused user "${userOf(url)}": wrong password or not allowed to connect. Check the user and password in DATABASE_URL.`;
		case '3D000':
			return `${capital(where)} has no such database. Create it first (createdb) or fix the name in DATABASE_URL.`;
		default: {
			// Never echo the URL itself: it may carry the password.
			const message = (err.message ?? String(e)).split(url).join('DATABASE_URL');
			if (/timeout/i.test(message)) return `Cannot reach ${where}: the connection timed out. Check the host, the port and any firewall.`;
			return `Cannot use ${where}: ${message}`;
		}
	}
}

const capital = (s: string) => s[0].toUpperCase() + s.slice(1);
