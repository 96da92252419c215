import { and, desc, eq, sql, type SQLWrapper } from 'drizzle-orm';
import { createDiagnoser, type Diagnoser } from '../diagnosis';
import { createResponseSerializer, type ResponseSerializer } from '../diagnosis/response-json';
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

/**
 * Editions never change once published, so their compiled diagnoser is cached by id; which
 * edition is published is read from the database on every call (no state that matters in memory):
 * here, or with the caller's API key (`authenticateApiKey` reads it in the same statement).
 */
const diagnosers = new Map<string, CompiledEdition>();
const MAX_CACHED_EDITIONS = 200;

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
	let compiled = diagnosers.get(row.id);
	if (!compiled) {
		const [{ content }] = await db
			.select({ content: rulebookEditions.content })
			.from(rulebookEditions)
			.where(eq(rulebookEditions.id, row.id));
		// createDiagnoser validates the stored content against rulebookSchema and throws if it fails.
		const diagnoser = createDiagnoser(content as Rulebook, {
			evaluator: getConfig().DIAGNOSIS_EVALUATOR
		});
		compiled = { rulebook: diagnoser.rulebook, diagnoser, serializer: createResponseSerializer() };
		if (diagnosers.size >= MAX_CACHED_EDITIONS) {
			diagnosers.delete(diagnosers.keys().next().value!);
		}
		diagnosers.set(row.id, compiled);
	}
	return { ...row, ...compiled };
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
export function getCompiledEdition(
	shopId: string,
	row: PublishedEditionRow
): Promise<PublishedEdition> {
	return getPublishedEdition(shopId, row);
}
