// The database schema (Drizzle): shops, people, sessions, keys, audit, counters, editions, cases.
import { sql } from 'drizzle-orm';
import { index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import {
	CASE_SOURCES,
	CASE_STATUSES,
	EVENT_KINDS,
	ODOMETER_UNITS,
	type CaseContact,
	type RankingEntry
} from '../../cases/model';
import type { StoredCaseState } from '../../cases/answers';

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

export const shops = sqliteTable(
	'shops',
	{
		id: text('id').primaryKey(),
		name: text('name').notNull(),
		/** Public name in the hosted intake form's address (/intake/<slug>); none: no hosted form. */
		slug: text('slug'),
		settings: text('settings', { mode: 'json' }).$type<ShopSettings>().notNull().default({}),
		isDemo: integer('is_demo', { mode: 'boolean' }).notNull().default(false),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('shops_slug_unique').on(t.slug)]
);

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

/** A new shop waiting for its owner to open the e-mailed link (sign-up reveals no accounts). */
export const signupRequests = sqliteTable(
	'signup_requests',
	{
		id: text('id').primaryKey(),
		email: text('email').notNull(),
		shopName: text('shop_name').notNull(),
		name: text('name').notNull(),
		passwordHash: text('password_hash').notNull(),
		tokenHash: text('token_hash').notNull(),
		expiresAt: integer('expires_at', { mode: 'timestamp' }).notNull(),
		usedAt: integer('used_at', { mode: 'timestamp' }),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('signup_requests_token_unique').on(t.tokenHash)]
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

/** A shop's vehicle; one per VIN per shop (vehicles without a VIN are told apart by plate). */
export const vehicles = sqliteTable(
	'vehicles',
	{
		id: text('id').primaryKey(),
		shopId: text('shop_id')
			.notNull()
			.references(() => shops.id),
		/** Upper case, check digit verified (49 CFR 565). */
		vin: text('vin'),
		/** Registration plate or the fleet's own number, upper case without spaces. */
		plate: text('plate'),
		year: integer('year'),
		make: text('make'),
		model: text('model'),
		engine: text('engine'),
		createdAt: createdAt()
	},
	(t) => [
		uniqueIndex('vehicles_shop_vin_unique').on(t.shopId, t.vin),
		index('vehicles_shop_plate_idx').on(t.shopId, t.plate)
	]
);

export const cases = sqliteTable(
	'cases',
	{
		id: text('id').primaryKey(),
		shopId: text('shop_id')
			.notNull()
			.references(() => shops.id),
		/** The edition the case is scored with; changed only by a recorded `rescored` event. */
		editionId: text('edition_id')
			.notNull()
			.references(() => rulebookEditions.id),
		status: text('status', { enum: CASE_STATUSES }).notNull().default('waiting'),
		source: text('source', { enum: CASE_SOURCES }).notNull(),
		createdBy: text('created_by').references(() => users.id),
		apiKeyId: text('api_key_id').references(() => apiKeys.id),
		/** Null only for an intake case that arrived without vehicle details. */
		vehicleId: text('vehicle_id').references(() => vehicles.id),
		odometerValue: real('odometer_value'),
		odometerUnit: text('odometer_unit', { enum: ODOMETER_UNITS }),
		complaint: text('complaint'),
		contact: text('contact', { mode: 'json' }).$type<CaseContact>(),
		assignedTo: text('assigned_to').references(() => users.id),
		/** Sequence number of the case's last event; the next event takes the one after. */
		lastSeq: integer('last_seq').notNull().default(0),
		/** The ranking after the last event, best first (the full ranking is on the event). */
		topCauses: text('top_causes', { mode: 'json' }).$type<RankingEntry[]>().notNull().default([]),
		/** The answers derived from the events up to last_seq, kept so an append need not re-read
		 * the timeline; null (or behind last_seq) means: derive it from the events. */
		state: text('state', { mode: 'json' }).$type<StoredCaseState>(),
		createdAt: createdAt(),
		updatedAt: integer('updated_at', { mode: 'timestamp' })
			.notNull()
			.default(sql`(unixepoch())`)
	},
	(t) => [
		index('cases_shop_idx').on(t.shopId, t.createdAt),
		index('cases_shop_status_idx').on(t.shopId, t.status, t.createdAt),
		index('cases_vehicle_idx').on(t.vehicleId)
	]
);

/**
 * The case timeline, append-only. `seq` is the server's order within the case (1, 2, 3 …; the
 * unique index makes concurrent appends retry instead of interleave); `clientEventId` is made
 * by the device, so a replayed append finds the stored event instead of adding a duplicate.
 */
export const caseEvents = sqliteTable(
	'case_events',
	{
		id: text('id').primaryKey(),
		shopId: text('shop_id')
			.notNull()
			.references(() => shops.id),
		caseId: text('case_id')
			.notNull()
			.references(() => cases.id),
		seq: integer('seq').notNull(),
		clientEventId: text('client_event_id').notNull(),
		kind: text('kind', { enum: EVENT_KINDS }).notNull(),
		payload: text('payload', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
		/** Every cause's probability after this event, best first. */
		ranking: text('ranking', { mode: 'json' }).$type<RankingEntry[]>().notNull(),
		/** The edition the ranking was scored with. */
		editionId: text('edition_id')
			.notNull()
			.references(() => rulebookEditions.id),
		actorUserId: text('actor_user_id').references(() => users.id),
		apiKeyId: text('api_key_id').references(() => apiKeys.id),
		createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull()
	},
	(t) => [
		uniqueIndex('case_events_case_seq_unique').on(t.caseId, t.seq),
		uniqueIndex('case_events_case_client_id_unique').on(t.caseId, t.clientEventId)
	]
);

export type Shop = typeof shops.$inferSelect;
export type User = typeof users.$inferSelect;
export type ApiKey = typeof apiKeys.$inferSelect;
export type RulebookEdition = typeof rulebookEditions.$inferSelect;
export type Vehicle = typeof vehicles.$inferSelect;
export type Case = typeof cases.$inferSelect;
export type CaseEvent = typeof caseEvents.$inferSelect;
