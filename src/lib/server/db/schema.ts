/**
 * The database schema. Plain PostgreSQL types only, so the same schema and migrations run on
 * embedded PGlite (default) and on a PostgreSQL server (DATABASE_URL).
 */
import { sql } from 'drizzle-orm';
import {
	pgTable,
	text,
	uuid,
	timestamp,
	integer,
	jsonb,
	primaryKey,
	uniqueIndex,
	index,
	pgEnum
} from 'drizzle-orm/pg-core';

export const ROLES = ['owner', 'designer', 'artist', 'printer', 'reviewer'] as const;
export type Role = (typeof ROLES)[number];
export const roleEnum = pgEnum('role', ROLES);

const createdAt = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow();

export const users = pgTable(
	'users',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		email: text('email').notNull(),
		name: text('name').notNull(),
		passwordHash: text('password_hash').notNull(),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('users_email_unique').on(sql`lower(${t.email})`)]
);

export const teams = pgTable('teams', {
	id: uuid('id').primaryKey().defaultRandom(),
	name: text('name').notNull(),
	createdAt: createdAt()
});

export const memberships = pgTable(
	'memberships',
	{
		teamId: uuid('team_id')
			.notNull()
			.references(() => teams.id, { onDelete: 'cascade' }),
		userId: uuid('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		role: roleEnum('role').notNull(),
		createdAt: createdAt()
	},
	(t) => [primaryKey({ columns: [t.teamId, t.userId] }), index('memberships_user').on(t.userId)]
);

export const invitations = pgTable(
	'invitations',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		teamId: uuid('team_id')
			.notNull()
			.references(() => teams.id, { onDelete: 'cascade' }),
		email: text('email').notNull(),
		role: roleEnum('role').notNull(),
		tokenHash: text('token_hash').notNull(),
		invitedBy: uuid('invited_by').references(() => users.id, { onDelete: 'set null' }),
		expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
		acceptedAt: timestamp('accepted_at', { withTimezone: true }),
		acceptedBy: uuid('accepted_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('invitations_token').on(t.tokenHash), index('invitations_team').on(t.teamId)]
);

export const passwordResets = pgTable(
	'password_resets',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: uuid('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		tokenHash: text('token_hash').notNull(),
		expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
		usedAt: timestamp('used_at', { withTimezone: true }),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('password_resets_token').on(t.tokenHash)]
);

/** Failed sign-ins, per account (`email:…`) and per address (`ip:…`), for throttling. */
export const signInFailures = pgTable(
	'sign_in_failures',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		key: text('key').notNull(),
		createdAt: createdAt()
	},
	(t) => [index('sign_in_failures_key').on(t.key, t.createdAt)]
);

export const apiTokens = pgTable(
	'api_tokens',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: uuid('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		/** SHA-256 of the token; the token itself is shown once and never stored. */
		tokenHash: text('token_hash').notNull(),
		/** First characters, so a person can tell their tokens apart. */
		prefix: text('prefix').notNull(),
		lastUsedAt: timestamp('last_used_at', { withTimezone: true }),
		revokedAt: timestamp('revoked_at', { withTimezone: true }),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('api_tokens_hash').on(t.tokenHash)]
);

export const BLEED_STANDARDS = ['metric', 'us'] as const;

export const games = pgTable(
	'games',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		teamId: uuid('team_id')
			.notNull()
			.references(() => teams.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		slug: text('slug').notNull(),
		bleedStandard: text('bleed_standard', { enum: BLEED_STANDARDS }).notNull().default('metric'),
		defaultCardSize: text('default_card_size').notNull().default('poker'),
		version: integer('version').notNull().default(1),
		createdAt: createdAt(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [uniqueIndex('games_team_slug').on(t.teamId, t.slug)]
);

export const activity = pgTable(
	'activity',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		teamId: uuid('team_id')
			.notNull()
			.references(() => teams.id, { onDelete: 'cascade' }),
		gameId: uuid('game_id').references(() => games.id, { onDelete: 'cascade' }),
		userId: uuid('user_id').references(() => users.id, { onDelete: 'set null' }),
		action: text('action').notNull(),
		detail: jsonb('detail').$type<Record<string, unknown>>().notNull().default({}),
		createdAt: createdAt()
	},
	(t) => [index('activity_team').on(t.teamId, t.createdAt), index('activity_game').on(t.gameId)]
);

/** Messages caught by the local SMTP server in development, demo and tests. */
export const caughtMail = pgTable('caught_mail', {
	id: uuid('id').primaryKey().defaultRandom(),
	from: text('from').notNull(),
	to: text('to').notNull(),
	subject: text('subject').notNull(),
	text: text('text').notNull(),
	createdAt: createdAt()
});
