/** Personal API tokens: shown once at creation, stored as SHA-256, revocable. */
import { and, eq, isNull, desc } from 'drizzle-orm';
import type { Db } from './db';
import { apiTokens, users } from './db/schema';
import { newToken, sha256 } from './auth/secrets';
import type { Actor } from './actor';

export const TOKEN_PREFIX = 'pdk_';

export async function createApiToken(db: Db, actor: Actor, { name }: { name: string }) {
	const { userId } = actor;
	const token = newToken(TOKEN_PREFIX);
	const [row] = await db
		.insert(apiTokens)
		.values({ userId, name, tokenHash: sha256(token), prefix: token.slice(0, 10) })
		.returning({ id: apiTokens.id });
	return { id: row.id, token };
}

export async function tokensOf(db: Db, userId: string) {
	return db
		.select({
			id: apiTokens.id,
			name: apiTokens.name,
			prefix: apiTokens.prefix,
			createdAt: apiTokens.createdAt,
			lastUsedAt: apiTokens.lastUsedAt
		})
		.from(apiTokens)
		.where(and(eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)))
		.orderBy(desc(apiTokens.createdAt));
}

export async function revokeApiToken(db: Db, actor: Actor, { id }: { id: string }): Promise<boolean> {
	const { userId } = actor;
	const rows = await db
		.update(apiTokens)
		.set({ revokedAt: new Date() })
		.where(and(eq(apiTokens.id, id), eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)))
		.returning({ id: apiTokens.id });
	return rows.length > 0;
}

/** The token's owner, or null for unknown or revoked tokens. */
export async function userForToken(db: Db, token: string) {
	const [row] = await db
		.select({ id: users.id, email: users.email, name: users.name, tokenId: apiTokens.id })
		.from(apiTokens)
		.innerJoin(users, eq(users.id, apiTokens.userId))
		.where(and(eq(apiTokens.tokenHash, sha256(token)), isNull(apiTokens.revokedAt)));
	if (!row) return null;
	await db.update(apiTokens).set({ lastUsedAt: new Date() }).where(eq(apiTokens.id, row.tokenId));
	return { id: row.id, email: row.email, name: row.name };
}
