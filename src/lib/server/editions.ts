// Rulebook editions of a shop: the base edition for new shops, and the compiled published one.
import { createHash } from 'node:crypto';
import { and, desc, eq, sql, type SQLWrapper } from 'drizzle-orm';
import { createDiagnoser, type Diagnoser } from '../diagnosis';
import { createResponseSerializer, type ResponseSerializer } from '../api/response-json';
import { loadRulebookFromDir } from '../diagnosis/load';
import type { Rulebook } from '../diagnosis/schema';
import { db } from './db';
import { rulebookEditions } from './db/schema';
import { auditInsert } from './audit';
import { getConfig } from './config';
import { generateId } from './auth/crypto';
import { AppError } from './errors';

let baseRulebook: Rulebook | undefined;

/** The shipped rulebook in rules/, validated once per process. */
export function getBaseRulebook(): Rulebook {
	baseRulebook ??= loadRulebookFromDir(getConfig().RULES_DIR);
	return baseRulebook;
}

/** The statement that gives a new shop the base rulebook as its published edition 1. */
export function baseEditionInsert(shopId: string, createdBy: string | null) {
	return db.insert(rulebookEditions).values({
		id: generateId(),
		shopId,
		number: 1,
		status: 'published',
		content: getBaseRulebook(),
		notes: 'Base rulebook shipped with Causeway',
		createdBy,
		publishedAt: new Date()
	});
}

export async function seedBaseEdition(shopId: string, createdBy: string | null) {
	await db.batch([
		baseEditionInsert(shopId, createdBy),
		auditInsert({
			shopId,
			actorUserId: createdBy,
			action: 'rulebook.published',
			target: 'edition 1',
			detail: { source: 'base rulebook' }
		})
	]);
}

/** Which edition a shop scores with: the published one with the highest number. */
export type PublishedEditionRow = { id: string; number: number; publishedAt: Date | null };

type CompiledEdition = {
	diagnoser: Diagnoser;
	rulebook: Rulebook;
	/** Writes API responses scored with this edition. */
	serializer: ResponseSerializer;
};

export type PublishedEdition = PublishedEditionRow & CompiledEdition;

/** The published editions of a shop (a column or a placeholder); take the highest number. */
export const publishedEditionsOf = (shopId: SQLWrapper) =>
	and(eq(rulebookEditions.shopId, shopId), eq(rulebookEditions.status, 'published'));

/** Compiled editions kept (each a few megabytes); the least recently used goes first. */
export const MAX_COMPILED_EDITIONS = 32;
/** Edition ids remembered with the content they hold (a reference each). */
export const MAX_KNOWN_EDITION_IDS = 20_000;

/** A Map used as a least-recently-used cache: a hit moves the entry to the end. */
function createLru<K, V>(capacity: number) {
	const entries = new Map<K, V>();
	return {
		get(key: K): V | undefined {
			const value = entries.get(key);
			if (value !== undefined) {
				entries.delete(key);
				entries.set(key, value);
			}
			return value;
		},
		set(key: K, value: V) {
			entries.delete(key);
			entries.set(key, value);
			if (entries.size > capacity) entries.delete(entries.keys().next().value as K);
		},
		delete(key: K) {
			entries.delete(key);
		}
	};
}

function compileEdition(content: unknown): CompiledEdition {
	// createDiagnoser validates the stored content against rulebookSchema and throws if it fails.
	const diagnoser = createDiagnoser(content as Rulebook);
	return { rulebook: diagnoser.rulebook, diagnoser, serializer: createResponseSerializer() };
}

/**
 * Editions never change once published, so each is compiled once and kept; which edition is
 * published is read from the database on every call (no state that matters in memory): here, or
 * with the caller's API key (`authenticateApiKey` reads it in the same statement). Every shop
 * starts with its own copy of the base rulebook, so compiled editions are kept by a hash of their
 * content and shared by every edition id that holds it. Promises are kept, not results, so that
 * concurrent first requests wait for the one read and the one compilation.
 */
const byContent = createLru<string, Promise<CompiledEdition>>(MAX_COMPILED_EDITIONS);
const hashByEditionId = createLru<string, string>(MAX_KNOWN_EDITION_IDS);
/** Editions whose content is being read, by id (an entry lives only while its read runs). */
const loading = new Map<string, Promise<CompiledEdition>>();

function hashContent(content: unknown): string {
	return createHash('sha256').update(JSON.stringify(content)).digest('base64url');
}

async function loadCompiledEdition(editionId: string): Promise<CompiledEdition> {
	const [{ content }] = await db
		.select({ content: rulebookEditions.content })
		.from(rulebookEditions)
		.where(eq(rulebookEditions.id, editionId));
	const hash = hashContent(content);
	hashByEditionId.set(editionId, hash);
	let compiled = byContent.get(hash);
	if (!compiled) {
		compiled = Promise.resolve().then(() => compileEdition(content));
		byContent.set(hash, compiled);
		// A failed compilation is not kept: the next request tries again.
		void compiled.catch(() => byContent.delete(hash));
	}
	return compiled;
}

function getCompiledEdition(editionId: string): Promise<CompiledEdition> {
	const hash = hashByEditionId.get(editionId);
	const kept = hash === undefined ? undefined : byContent.get(hash);
	if (kept) return kept;
	let pending = loading.get(editionId);
	if (!pending) {
		pending = loadCompiledEdition(editionId).finally(() => loading.delete(editionId));
		loading.set(editionId, pending);
	}
	return pending;
}

const findPublishedEdition = db
	.select({
		id: rulebookEditions.id,
		number: rulebookEditions.number,
		publishedAt: rulebookEditions.publishedAt
	})
	.from(rulebookEditions)
	.where(publishedEditionsOf(sql.placeholder('shopId')))
	.orderBy(desc(rulebookEditions.number))
	.limit(1)
	.prepare();

export async function getPublishedEdition(
	shopId: string,
	alreadyRead?: PublishedEditionRow | null
): Promise<PublishedEdition> {
	const row =
		alreadyRead === undefined ? (await findPublishedEdition.all({ shopId }))[0] : alreadyRead;
	if (!row) throw new AppError('not_found', 'This shop has no published rulebook edition.');
	return { ...row, ...(await getCompiledEdition(row.id)) };
}

export async function listEditions(shopId: string) {
	return db
		.select({
			id: rulebookEditions.id,
			number: rulebookEditions.number,
			status: rulebookEditions.status,
			notes: rulebookEditions.notes,
			createdAt: rulebookEditions.createdAt,
			publishedAt: rulebookEditions.publishedAt
		})
		.from(rulebookEditions)
		.where(eq(rulebookEditions.shopId, shopId))
		.orderBy(desc(rulebookEditions.number));
}

/**
 * The compiled diagnoser of one edition whose row the caller has read (a case keeps the edition
 * it was scored with, published or since retired), from the same cache.
 */
export function getCaseEdition(
	shopId: string,
	row: PublishedEditionRow
): Promise<PublishedEdition> {
	return getPublishedEdition(shopId, row);
}
