/**
 * The database schema. Plain PostgreSQL types only, so the same schema and migrations run on
 * embedded PGlite (default) and on a PostgreSQL server (DATABASE_URL).
 */
import type { RefusalReason } from '../refusals';
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
	pgEnum,
	doublePrecision,
	boolean,
	customType
} from 'drizzle-orm/pg-core';

/** Raw bytes (PostgreSQL bytea): small binary files that belong to a row, such as an ICC profile. */
const bytea = customType<{ data: Uint8Array; driverData: Uint8Array }>({
	dataType: () => 'bytea',
	fromDriver: (v) => new Uint8Array(v)
});

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

/**
 * Signed-in browser sessions. The session cookie names its row; a row that is ended (sign-out,
 * "end this session", a password reset or change) makes the cookie worthless at once.
 */
export const sessions = pgTable(
	'sessions',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: uuid('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		userAgent: text('user_agent').notNull().default(''),
		address: text('address').notNull().default(''),
		createdAt: createdAt(),
		lastSeenAt: timestamp('last_seen_at', { withTimezone: true }).notNull().defaultNow(),
		endedAt: timestamp('ended_at', { withTimezone: true })
	},
	(t) => [index('sessions_user').on(t.userId)]
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
		/** The printer profile whose press profile the game's PDF/X files use when none is named (built-in when unset). */
		pressProfileId: uuid('press_profile_id').references(() => printerProfiles.id, { onDelete: 'set null' }),
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

/* ------------------------------------------------------------- game content */

/** The collections of a game's editable objects; each object is validated by its zod schema. */
export const COLLECTIONS = ['runner', 'moneyTable', 'kind', 'card', 'art'] as const;
export type Collection = (typeof COLLECTIONS)[number];
/** What the history records: the collections, and the game's settings as one object of their own. */
export const HISTORY_COLLECTIONS = [...COLLECTIONS, 'settings'] as const;
export type HistoryCollection = (typeof HISTORY_COLLECTIONS)[number];
/** The object id the game's settings are recorded under. */
export const SETTINGS_OBJECT_ID = 'settings';

/**
 * One editable object of a game (a runner, money table, card kind, card or art asset) as the
 * JSON its schema in src/lib/game/model.ts describes. `version` guards against lost updates:
 * a save names the version it was based on and is refused when the row has moved on.
 */
export const gameObjects = pgTable(
	'game_objects',
	{
		gameId: uuid('game_id')
			.notNull()
			.references(() => games.id, { onDelete: 'cascade' }),
		collection: text('collection', { enum: COLLECTIONS }).notNull(),
		id: text('id').notNull(),
		/** Order within the collection, as the designer arranged it. */
		position: integer('position').notNull().default(0),
		data: jsonb('data').$type<Record<string, unknown>>().notNull(),
		version: integer('version').notNull().default(1),
		updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [primaryKey({ columns: [t.gameId, t.collection, t.id] })]
);

/**
 * Every version an object of a game has had: each save, delete and restore adds a row, so the
 * history lists who changed what when, and any version can be restored (as a new version).
 * `data` is the object as saved; for a delete, as it was just before.
 */
export const objectVersions = pgTable(
	'object_versions',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		gameId: uuid('game_id')
			.notNull()
			.references(() => games.id, { onDelete: 'cascade' }),
		collection: text('collection', { enum: HISTORY_COLLECTIONS }).notNull(),
		objectId: text('object_id').notNull(),
		/** The object's version this row records (for a delete: the version deleted). */
		version: integer('version').notNull(),
		action: text('action', { enum: ['saved', 'deleted', 'restored'] }).notNull(),
		/** For a restore: the version brought back. */
		restoredFrom: integer('restored_from'),
		data: jsonb('data').$type<Record<string, unknown>>().notNull(),
		changedBy: uuid('changed_by').references(() => users.id, { onDelete: 'set null' }),
		changedAt: timestamp('changed_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('object_versions_object').on(t.gameId, t.collection, t.objectId, t.changedAt), index('object_versions_game').on(t.gameId, t.changedAt)]
);

/** Game-wide settings that are not objects of their own (the rogue runner). */
export const gameSettings = pgTable('game_settings', {
	gameId: uuid('game_id')
		.primaryKey()
		.references(() => games.id, { onDelete: 'cascade' }),
	data: jsonb('data').$type<Record<string, unknown>>().notNull().default({}),
	version: integer('version').notNull().default(1)
});

/** Art files, content-addressed: the bytes live under the data directory, named by SHA-256. */
export const artFiles = pgTable('art_files', {
	sha256: text('sha256').primaryKey(),
	mime: text('mime').notNull(),
	bytes: integer('bytes').notNull(),
	widthPx: integer('width_px').notNull(),
	heightPx: integer('height_px').notNull(),
	dpiX: integer('dpi_x'),
	dpiY: integer('dpi_y'),
	createdAt: createdAt()
});

/** Every file an art asset has had; replacing art adds a row and keeps the earlier ones. */
export const artVersions = pgTable(
	'art_versions',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		gameId: uuid('game_id')
			.notNull()
			.references(() => games.id, { onDelete: 'cascade' }),
		artId: text('art_id').notNull(),
		number: integer('number').notNull(),
		sha256: text('sha256')
			.notNull()
			.references(() => artFiles.sha256),
		fileName: text('file_name').notNull(),
		uploadedBy: uuid('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('art_versions_number').on(t.gameId, t.artId, t.number)]
);

/* ----------------------------------------------------------- proofs, review */

/**
 * A proof: an immutable snapshot of the game (its data and the exact art files, which are
 * content-addressed and never deleted), numbered per game. Released proofs are what printers see.
 */
export const proofs = pgTable(
	'proofs',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		gameId: uuid('game_id')
			.notNull()
			.references(() => games.id, { onDelete: 'cascade' }),
		number: integer('number').notNull(),
		description: text('description').notNull(),
		snapshot: jsonb('snapshot').$type<Record<string, unknown>>().notNull(),
		createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: createdAt(),
		releasedAt: timestamp('released_at', { withTimezone: true }),
		releasedBy: uuid('released_by').references(() => users.id, { onDelete: 'set null' }),
		withdrawnAt: timestamp('withdrawn_at', { withTimezone: true }),
		withdrawnBy: uuid('withdrawn_by').references(() => users.id, { onDelete: 'set null' }),
		withdrawNote: text('withdraw_note'),
		/** The readiness list when the proof was cut: warnings never block, the proof keeps them. */
		readiness: jsonb('readiness').$type<{ code: string; message: string }[]>().notNull().default([])
	},
	(t) => [uniqueIndex('proofs_game_number').on(t.gameId, t.number)]
);

export const SIDES = ['front', 'back'] as const;

/** A comment pinned to a spot on one face of a card of a proof (mm from the face's top-left, bleed included), or a reply. */
export const proofComments = pgTable(
	'proof_comments',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		proofId: uuid('proof_id')
			.notNull()
			.references(() => proofs.id, { onDelete: 'cascade' }),
		/** The thread's first comment; null for a first comment itself. */
		threadId: uuid('thread_id'),
		cardId: text('card_id').notNull(),
		side: text('side', { enum: SIDES }).notNull(),
		xMm: doublePrecision('x_mm').notNull(),
		yMm: doublePrecision('y_mm').notNull(),
		body: text('body').notNull(),
		authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
		createdAt: createdAt(),
		resolvedAt: timestamp('resolved_at', { withTimezone: true }),
		resolvedBy: uuid('resolved_by').references(() => users.id, { onDelete: 'set null' })
	},
	(t) => [index('proof_comments_proof').on(t.proofId, t.createdAt)]
);

export const VERDICTS = ['approve', 'changes'] as const;

export const proofVerdicts = pgTable(
	'proof_verdicts',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		proofId: uuid('proof_id')
			.notNull()
			.references(() => proofs.id, { onDelete: 'cascade' }),
		reviewerId: uuid('reviewer_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		verdict: text('verdict', { enum: VERDICTS }).notNull(),
		note: text('note').notNull().default(''),
		createdAt: createdAt()
	},
	(t) => [index('proof_verdicts_proof').on(t.proofId)]
);

/** People who asked for no e-mail about a game. */
export const mutes = pgTable(
	'mutes',
	{
		userId: uuid('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		gameId: uuid('game_id')
			.notNull()
			.references(() => games.id, { onDelete: 'cascade' }),
		createdAt: createdAt()
	},
	(t) => [primaryKey({ columns: [t.userId, t.gameId] })]
);

/* ---------------------------------------------------------- printer profiles */

export const PAPERS = ['a4', 'a3', 'letter', 'tabloid', 'custom'] as const;
export const SHEET_LAYOUTS = ['spaced', 'butted', 'fold'] as const;
export const DUPLEX_MODES = ['none', 'long', 'short'] as const;

/** How a team's printer (home or shop) takes sheets: kept by printers and designers. */
export const printerProfiles = pgTable('printer_profiles', {
	id: uuid('id').primaryKey().defaultRandom(),
	teamId: uuid('team_id')
		.notNull()
		.references(() => teams.id, { onDelete: 'cascade' }),
	name: text('name').notNull(),
	paper: text('paper', { enum: PAPERS }).notNull().default('a4'),
	customWidthMm: doublePrecision('custom_width_mm'),
	customHeightMm: doublePrecision('custom_height_mm'),
	marginMm: doublePrecision('margin_mm').notNull().default(5),
	layout: text('layout', { enum: SHEET_LAYOUTS }).notNull().default('spaced'),
	marks: boolean('marks').notNull().default(true),
	duplex: text('duplex', { enum: DUPLEX_MODES }).notNull().default('long'),
	backOffsetXMm: doublePrecision('back_offset_x_mm').notNull().default(0),
	backOffsetYMm: doublePrecision('back_offset_y_mm').notNull().default(0),
	colour: text('colour', { enum: ['rgb', 'cmyk'] }).notNull().default('rgb'),
	/** Plain PDF or PDF/X, and how art goes into the press profile's CMYK. */
	output: text('output', { enum: ['plain', 'pdfx4', 'pdfx1a'] }).notNull().default('plain'),
	intent: text('intent', { enum: ['relative', 'perceptual'] }).notNull().default('relative'),
	/**
	 * The press profile: the printer's own ICC profile (a CMYK output profile, checked on upload)
	 * and its printing condition; with no profile uploaded, the built-in FOGRA39 one and its condition.
	 */
	iccProfile: bytea('icc_profile'),
	iccName: text('icc_name'),
	pressCondition: text('press_condition'),
	pressConditionInfo: text('press_condition_info'),
	pressRegistry: text('press_registry'),
	inkLimitPct: integer('ink_limit_pct'),
	version: integer('version').notNull().default(1),
	createdAt: createdAt()
});

/* ------------------------------------------------------------------ odds lab */

/** A stage scenario kept by name per game, with the answer of its last run. */
export const oddsScenarios = pgTable(
	'odds_scenarios',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		gameId: uuid('game_id')
			.notNull()
			.references(() => games.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		/** The scenario as src/lib/odds/scenario.ts describes it. */
		scenario: jsonb('scenario').$type<Record<string, unknown>>().notNull(),
		/** The last answer (the API's JSON), null until it has been run. */
		lastResult: jsonb('last_result').$type<Record<string, unknown>>(),
		createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: createdAt(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [uniqueIndex('odds_scenarios_game_name').on(t.gameId, t.name)]
);

/* ------------------------------------------------------------------ print jobs */

export const PRINT_JOB_STATES = ['queued', 'running', 'done', 'failed'] as const;

/**
 * A sheet build started from the print page. Its state lives here, not in a process, so any app
 * process answers its progress and serves its file; the file itself is in the file store under
 * `fileKey`, written once (the first build to finish wins; a retry never makes a second file).
 */
export const printJobs = pgTable(
	'print_jobs',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: uuid('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		gameId: uuid('game_id')
			.notNull()
			.references(() => games.id, { onDelete: 'cascade' }),
		state: text('state', { enum: PRINT_JOB_STATES }).notNull().default('queued'),
		done: integer('done').notNull().default(0),
		total: integer('total').notNull().default(0),
		/** What to build, fixed when queued: the game as data and the options. */
		request: jsonb('request').$type<Record<string, unknown>>().notNull(),
		/** SHA-256 of the request as queued: a job asking for what was built a moment ago finds that file by it. */
		requestSha256: text('request_sha256'),
		fileName: text('file_name').notNull(),
		fileKey: text('file_key'),
		/** Sheets, pages, bytes and warnings of the finished file. */
		result: jsonb('result').$type<{ sheets?: number; pages?: number; guidePages?: number; bytes: number; warnings: string[] }>(),
		/** Why a build failed: a refusal's reason (failed for good), none for a fault. */
		error: jsonb('error').$type<{ reason?: RefusalReason; message: string }>(),
		attempts: integer('attempts').notNull().default(0),
		createdAt: createdAt(),
		finishedAt: timestamp('finished_at', { withTimezone: true })
	},
	(t) => [index('print_jobs_user').on(t.userId, t.createdAt), index('print_jobs_request').on(t.gameId, t.requestSha256)]
);

export const ODDS_JOB_STATES = ['queued', 'running', 'done', 'failed', 'cancelled'] as const;

/**
 * Large odds runs, as rows any app process can run, follow and cancel: the request fixed when
 * queued (the game as data and the checked request), the progress, then the answer.
 */
export const oddsJobs = pgTable(
	'odds_jobs',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: uuid('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		gameId: uuid('game_id')
			.notNull()
			.references(() => games.id, { onDelete: 'cascade' }),
		state: text('state', { enum: ODDS_JOB_STATES }).notNull().default('queued'),
		done: integer('done').notNull().default(0),
		total: integer('total').notNull().default(0),
		request: jsonb('request').$type<Record<string, unknown>>().notNull(),
		result: jsonb('result').$type<Record<string, unknown>>(),
		error: text('error'),
		attempts: integer('attempts').notNull().default(0),
		createdAt: createdAt(),
		finishedAt: timestamp('finished_at', { withTimezone: true })
	},
	(t) => [index('odds_jobs_user').on(t.userId, t.state)]
);
