/**
 * Slowing down password guessing: failed sign-ins are counted per account and per address over
 * a window; past the limit further attempts are refused (429) until the window moves on.
 */
import { and, eq, gt, lt, count } from 'drizzle-orm';
import type { Db } from '../db';
import { signInFailures } from '../db/schema';

export const WINDOW_MS = 15 * 60 * 1000;
export const MAX_PER_ACCOUNT = 5;
export const MAX_PER_ADDRESS = 20;

const accountKey = (email: string) => `email:${email.trim().toLowerCase()}`;
const addressKey = (ip: string) => `ip:${ip}`;

async function failures(db: Db, key: string): Promise<number> {
	const since = new Date(Date.now() - WINDOW_MS);
	const [row] = await db
		.select({ n: count() })
		.from(signInFailures)
		.where(and(eq(signInFailures.key, key), gt(signInFailures.createdAt, since)));
	return row.n;
}

/** True when this account or this address has failed too often lately. */
export async function signInRefused(db: Db, email: string, ip: string): Promise<boolean> {
	const [a, b] = await Promise.all([failures(db, accountKey(email)), failures(db, addressKey(ip))]);
	return a >= MAX_PER_ACCOUNT || b >= MAX_PER_ADDRESS;
}

const signUpKey = (ip: string) => `signup-ip:${ip}`;

/** Sign-ups that hit an existing address, per client address: slows a sweep for who has an account. */
export async function signUpRefused(db: Db, ip: string): Promise<boolean> {
	return (await failures(db, signUpKey(ip))) >= MAX_PER_ADDRESS;
}

export async function recordSignUpClash(db: Db, ip: string): Promise<void> {
	await db.insert(signInFailures).values({ key: signUpKey(ip) });
}

export async function recordFailure(db: Db, email: string, ip: string): Promise<void> {
	await db.insert(signInFailures).values([{ key: accountKey(email) }, { key: addressKey(ip) }]);
	// Old rows serve no purpose; drop them as we go.
	await db
		.delete(signInFailures)
		.where(lt(signInFailures.createdAt, new Date(Date.now() - WINDOW_MS)));
}
