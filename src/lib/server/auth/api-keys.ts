import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import { db } from '../db';
import { apiKeys, rulebookEditions } from '../db/schema';
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
 * three, and under load each statement costs a fifth of a millisecond. The edition part matches
 * `findPublishedEdition` in editions.ts.
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
	.leftJoin(
		rulebookEditions,
		and(eq(rulebookEditions.shopId, apiKeys.shopId), eq(rulebookEditions.status, 'published'))
	)
	.where(and(eq(apiKeys.keyHash, sql.placeholder('keyHash')), isNull(apiKeys.revokedAt)))
	.orderBy(desc(rulebookEditions.number))
	.limit(1)
	.prepare();

export type PublishedEditionRow = { id: string; number: number; publishedAt: Date | null };

export async function authenticateApiKey(key: string) {
	if (!key.startsWith(API_KEY_PREFIX)) return null;
	const [row] = await findActiveKey.all({ keyHash: hashToken(key) });
	if (!row) return null;
	const now = Date.now();
	if (!row.lastUsedAt || now - row.lastUsedAt.getTime() >= LAST_USED_RESOLUTION_MS) {
		await db
			.update(apiKeys)
			.set({ lastUsedAt: new Date(now) })
			.where(eq(apiKeys.id, row.id));
	}
	const publishedEdition: PublishedEditionRow | null = row.editionId
		? { id: row.editionId, number: row.editionNumber!, publishedAt: row.editionPublishedAt }
		: null;
	return { id: row.id, shopId: row.shopId, publishedEdition };
}
