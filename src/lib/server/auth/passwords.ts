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
