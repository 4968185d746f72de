import { hash, verify } from '@node-rs/argon2';

/** argon2id with the library's defaults (memory-hard; about 20 ms a hash here). */
export const hashPassword = (password: string) => hash(password);

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
	try {
		return await verify(passwordHash, password);
	} catch {
		return false;
	}
}

let dummy: Promise<string> | undefined;

/**
 * Checks a password against an account's hash, or against a throw-away hash when there is no
 * such account, so an answer takes as long for an unknown address as for a known one.
 */
export async function checkPassword(passwordHash: string | undefined, password: string): Promise<boolean> {
	if (passwordHash) return verifyPassword(passwordHash, password);
	dummy ??= hash('no account has this password');
	await verifyPassword(await dummy, password);
	return false;
}
