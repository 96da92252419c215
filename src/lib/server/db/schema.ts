import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

/** Seconds since the epoch; lucia's SQLite adapter stores session expiry this way too. */
const createdAt = () =>
	integer('created_at', { mode: 'timestamp' })
		.notNull()
		.default(sql`(unixepoch())`);

export const ROLES = ['technician', 'lead', 'manager', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export type ShopSettings = {
	/** Coolant service interval defaults for the service-interval calculator. */
	coolant?: { firstChangeKm: number; thenEveryKm: number; everyMonths: number };
};

export const shops = sqliteTable('shops', {
	id: text('id').primaryKey(),
	name: text('name').notNull(),
	settings: text('settings', { mode: 'json' }).$type<ShopSettings>().notNull().default({}),
	isDemo: integer('is_demo', { mode: 'boolean' }).notNull().default(false),
	createdAt: createdAt()
});

export const users = sqliteTable(
	'users',
	{
		id: text('id').primaryKey(),
		shopId: text('shop_id')
			.notNull()
			.references(() => shops.id),
		email: text('email').notNull(),
		name: text('name').notNull(),
		role: text('role', { enum: ROLES }).notNull(),
		passwordHash: text('password_hash').notNull(),
		active: integer('active', { mode: 'boolean' }).notNull().default(true),
		createdAt: createdAt(),
		deactivatedAt: integer('deactivated_at', { mode: 'timestamp' })
	},
	(t) => [uniqueIndex('users_email_unique').on(t.email), index('users_shop_idx').on(t.shopId)]
);

export const sessions = sqliteTable(
	'sessions',
	{
		/** SHA-256 of the cookie token: a stolen database does not yield live sessions. */
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		expiresAt: integer('expires_at').notNull(),
		/** Seconds since the epoch; enforces the absolute timeout whatever the sliding expiry says. */
		issuedAt: integer('issued_at').notNull()
	},
	(t) => [index('sessions_user_idx').on(t.userId)]
);

export const invites = sqliteTable(
	'invites',
	{
		id: text('id').primaryKey(),
		shopId: text('shop_id')
			.notNull()
			.references(() => shops.id),
		email: text('email').notNull(),
		role: text('role', { enum: ROLES }).notNull(),
		tokenHash: text('token_hash').notNull(),
		invitedBy: text('invited_by')
			.notNull()
			.references(() => users.id),
		expiresAt: integer('expires_at', { mode: 'timestamp' }).notNull(),
		usedAt: integer('used_at', { mode: 'timestamp' }),
		createdAt: createdAt()
	},
	(t) => [
		uniqueIndex('invites_token_unique').on(t.tokenHash),
		index('invites_shop_idx').on(t.shopId)
	]
);

export const passwordResets = sqliteTable(
	'password_resets',
	{
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		tokenHash: text('token_hash').notNull(),
		expiresAt: integer('expires_at', { mode: 'timestamp' }).notNull(),
		usedAt: integer('used_at', { mode: 'timestamp' }),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('password_resets_token_unique').on(t.tokenHash)]
);

export const apiKeys = sqliteTable(
	'api_keys',
	{
		id: text('id').primaryKey(),
		shopId: text('shop_id')
			.notNull()
			.references(() => shops.id),
		name: text('name').notNull(),
		/** First characters of the key, shown in lists so people can tell keys apart. */
		prefix: text('prefix').notNull(),
		keyHash: text('key_hash').notNull(),
		createdBy: text('created_by').references(() => users.id),
		createdAt: createdAt(),
		lastUsedAt: integer('last_used_at', { mode: 'timestamp' }),
		revokedAt: integer('revoked_at', { mode: 'timestamp' })
	},
	(t) => [
		uniqueIndex('api_keys_hash_unique').on(t.keyHash),
		index('api_keys_shop_idx').on(t.shopId)
	]
);

export const auditLog = sqliteTable(
	'audit_log',
	{
		id: integer('id').primaryKey({ autoIncrement: true }),
		shopId: text('shop_id')
			.notNull()
			.references(() => shops.id),
		actorUserId: text('actor_user_id').references(() => users.id),
		action: text('action').notNull(),
		target: text('target'),
		detail: text('detail', { mode: 'json' }).$type<Record<string, unknown>>(),
		ip: text('ip'),
		createdAt: createdAt()
	},
	(t) => [index('audit_shop_idx').on(t.shopId, t.createdAt)]
);

/**
 * Fixed-window counters shared by every app server (login failures per account and per IP,
 * API calls per key and per IP). `lockedUntil` is the gradual lock-out after failed sign-ins.
 */
export const rateLimits = sqliteTable('rate_limits', {
	key: text('key').primaryKey(),
	count: integer('count').notNull(),
	windowStart: integer('window_start').notNull(),
	lockedUntil: integer('locked_until')
});

export const EDITION_STATUSES = ['draft', 'published', 'retired'] as const;
export type EditionStatus = (typeof EDITION_STATUSES)[number];

export const rulebookEditions = sqliteTable(
	'rulebook_editions',
	{
		id: text('id').primaryKey(),
		shopId: text('shop_id')
			.notNull()
			.references(() => shops.id),
		number: integer('number').notNull(),
		status: text('status', { enum: EDITION_STATUSES }).notNull(),
		/** The assembled rulebook as validated by rulebookSchema. */
		content: text('content', { mode: 'json' }).notNull(),
		notes: text('notes'),
		createdBy: text('created_by').references(() => users.id),
		createdAt: createdAt(),
		publishedAt: integer('published_at', { mode: 'timestamp' }),
		retiredAt: integer('retired_at', { mode: 'timestamp' })
	},
	(t) => [uniqueIndex('editions_shop_number_unique').on(t.shopId, t.number)]
);

export const CASE_STATUSES = ['open', 'closed'] as const;

export const cases = sqliteTable(
	'cases',
	{
		id: text('id').primaryKey(),
		shopId: text('shop_id')
			.notNull()
			.references(() => shops.id),
		editionId: text('edition_id')
			.notNull()
			.references(() => rulebookEditions.id),
		status: text('status', { enum: CASE_STATUSES }).notNull().default('open'),
		source: text('source', { enum: ['bay', 'api'] }).notNull(),
		createdBy: text('created_by').references(() => users.id),
		apiKeyId: text('api_key_id').references(() => apiKeys.id),
		vehicle: text('vehicle', { mode: 'json' }).$type<Record<string, unknown>>(),
		complaint: text('complaint'),
		observations: text('observations', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
		unknown: text('unknown', { mode: 'json' }).$type<string[]>().notNull().default([]),
		result: text('result', { mode: 'json' }).$type<Record<string, unknown>>(),
		createdAt: createdAt()
	},
	(t) => [index('cases_shop_idx').on(t.shopId, t.createdAt)]
);

export type Shop = typeof shops.$inferSelect;
export type User = typeof users.$inferSelect;
export type ApiKey = typeof apiKeys.$inferSelect;
export type RulebookEdition = typeof rulebookEditions.$inferSelect;
