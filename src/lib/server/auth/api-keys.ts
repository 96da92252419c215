// API keys: create, list and revoke a shop's keys, and authenticate a request by its key.
import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import { db } from '../db';
import { apiKeys, rulebookEditions } from '../db/schema';
import { publishedEditionsOf, type PublishedEditionRow } from '../editions';
import { auditInsert } from '../audit';
import { AppError } from '../errors';
import { generateId, hashToken, randomToken } from './crypto';

export const API_KEY_PREFIX = 'cw_';
/** Characters of the key kept in clear so people can tell their keys apart. */
const SHOWN_PREFIX_LENGTH = 10;

type Actor = { id: string; shopId: string };

export const apiKeyInsert = (input: {
	shopId: string;
	name: string;
	key: string;
	createdBy: string | null;
}) =>
	db.insert(apiKeys).values({
		id: generateId(),
		shopId: input.shopId,
		name: input.name,
		prefix: input.key.slice(0, SHOWN_PREFIX_LENGTH),
		keyHash: hashToken(input.key),
		createdBy: input.createdBy
	});

export const generateApiKey = () => `${API_KEY_PREFIX}${randomToken(24)}`;

/** Creates a key; the full key is returned this once and never stored. */
export async function createApiKey(actor: Actor, name: string, ip?: string) {
	const key = generateApiKey();
	await db.batch([
		apiKeyInsert({ shopId: actor.shopId, name: name.trim(), key, createdBy: actor.id }),
		auditInsert({
			shopId: actor.shopId,
			actorUserId: actor.id,
			action: 'apikey.created',
			target: key.slice(0, SHOWN_PREFIX_LENGTH),
			detail: { name: name.trim() },
			ip
		})
	]);
	return { key, prefix: key.slice(0, SHOWN_PREFIX_LENGTH) };
}

export async function listApiKeys(shopId: string) {
	return db
		.select({
			id: apiKeys.id,
			name: apiKeys.name,
			prefix: apiKeys.prefix,
			createdAt: apiKeys.createdAt,
			lastUsedAt: apiKeys.lastUsedAt,
			revokedAt: apiKeys.revokedAt
		})
		.from(apiKeys)
		.where(eq(apiKeys.shopId, shopId))
		.orderBy(desc(apiKeys.createdAt));
}

export async function revokeApiKey(actor: Actor, keyId: string, ip?: string) {
	const [key] = await db
		.select()
		.from(apiKeys)
		.where(and(eq(apiKeys.id, keyId), eq(apiKeys.shopId, actor.shopId)));
	if (!key) throw new AppError('not_found', 'No such API key in this shop.');
	if (key.revokedAt) return;
	forgetCachedKeys(actor.shopId);
	await db.batch([
		db.update(apiKeys).set({ revokedAt: new Date() }).where(eq(apiKeys.id, key.id)),
		auditInsert({
			shopId: actor.shopId,
			actorUserId: actor.id,
			action: 'apikey.revoked',
			target: key.prefix,
			detail: { name: key.name },
			ip
		})
	]);
}

/** Last use is recorded to the minute: enough for people, and it spares a write per request. */
const LAST_USED_RESOLUTION_MS = 60_000;

/**
 * The key, its shop and the shop's published edition in one read: every intake call needs all
 * three, and under load each statement costs a fifth of a millisecond.
 */
const findActiveKey = db
	.select({
		id: apiKeys.id,
		shopId: apiKeys.shopId,
		lastUsedAt: apiKeys.lastUsedAt,
		editionId: rulebookEditions.id,
		editionNumber: rulebookEditions.number,
		editionPublishedAt: rulebookEditions.publishedAt
	})
	.from(apiKeys)
	.leftJoin(rulebookEditions, publishedEditionsOf(apiKeys.shopId))
	.where(and(eq(apiKeys.keyHash, sql.placeholder('keyHash')), isNull(apiKeys.revokedAt)))
	.orderBy(desc(rulebookEditions.number))
	.limit(1)
	.prepare();

type ActiveKey = { id: string; shopId: string; publishedEdition: PublishedEditionRow | null };

/**
 * Keys read in the last second, by hash. An intake form that sends many requests costs one read
 * a second instead of one per request. Revoking a key forgets its shop's entries at once on this
 * server; another server (several behind a load balancer) stops accepting it within the second,
 * as it sees a newly published edition. Unknown keys are never kept: each guess is read, and
 * counted against its address. Publishing an edition must call `forgetCachedKeys` for its shop.
 */
const KEY_CACHE_MS = 1000;
const MAX_CACHED_KEYS = 10_000;
const keyCache = new Map<string, { key: ActiveKey; readAt: number; lastUsedAt: number }>();

export function forgetCachedKeys(shopId?: string) {
	for (const [hash, entry] of keyCache) {
		if (shopId === undefined || entry.key.shopId === shopId) keyCache.delete(hash);
	}
}

export async function authenticateApiKey(key: string): Promise<ActiveKey | null> {
	if (!key.startsWith(API_KEY_PREFIX)) return null;
	const keyHash = hashToken(key);
	const now = Date.now();
	let entry = keyCache.get(keyHash);
	if (!entry || now - entry.readAt >= KEY_CACHE_MS) {
		const [row] = await findActiveKey.all({ keyHash });
		if (!row) {
			keyCache.delete(keyHash);
			return null;
		}
		const publishedEdition: PublishedEditionRow | null = row.editionId
			? { id: row.editionId, number: row.editionNumber!, publishedAt: row.editionPublishedAt }
			: null;
		if (keyCache.size >= MAX_CACHED_KEYS) keyCache.clear();
		entry = {
			key: { id: row.id, shopId: row.shopId, publishedEdition },
			readAt: now,
			lastUsedAt: row.lastUsedAt?.getTime() ?? 0
		};
		keyCache.set(keyHash, entry);
	}
	if (now - entry.lastUsedAt >= LAST_USED_RESOLUTION_MS) {
		entry.lastUsedAt = now;
		await db
			.update(apiKeys)
			.set({ lastUsedAt: new Date(now) })
			.where(eq(apiKeys.id, entry.key.id));
	}
	return entry.key;
}
