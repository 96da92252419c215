// The case tables' shared statements: a case row with its edition, its timeline, an event row.
import { and, asc, eq, sql } from 'drizzle-orm';
import type { EventKind, RankingEntry } from '../../cases/model';
import type { TimelineEvent } from '../../cases/answers';
import { db } from '../db';
import { caseEvents, cases, rulebookEditions, users } from '../db/schema';
import { generateId } from '../auth/crypto';
import { AppError } from '../errors';

/** Who is acting: a person of the shop, or (for intake) an API key or nobody. */
export type Actor = { shopId: string; userId: string | null; apiKeyId: string | null };

export const caseNotFound = () => new AppError('not_found', 'There is no such case in this shop.');

/** A case can hold this many events; past it, appends are refused (a bound on every read). */
export const MAX_EVENTS_PER_CASE = 5000;

const findCase = db
	.select({
		id: cases.id,
		shopId: cases.shopId,
		status: cases.status,
		source: cases.source,
		complaint: cases.complaint,
		lastSeq: cases.lastSeq,
		state: cases.state,
		editionId: cases.editionId,
		editionNumber: rulebookEditions.number,
		editionPublishedAt: rulebookEditions.publishedAt,
		actorName: users.name
	})
	.from(cases)
	.innerJoin(rulebookEditions, eq(rulebookEditions.id, cases.editionId))
	.leftJoin(users, and(eq(users.id, sql.placeholder('userId')), eq(users.shopId, cases.shopId)))
	.where(and(eq(cases.id, sql.placeholder('caseId')), eq(cases.shopId, sql.placeholder('shopId'))))
	.prepare();

export type CaseRow = NonNullable<Awaited<ReturnType<typeof findCase.all>>[number]>;

/** The case of the caller's shop, with its edition and the caller's name; undefined if none. */
export async function readCase(actor: Actor, caseId: string): Promise<CaseRow | undefined> {
	const rows = await findCase.all({ caseId, shopId: actor.shopId, userId: actor.userId ?? '' });
	return rows[0];
}

const findTimeline = db
	.select({
		seq: caseEvents.seq,
		kind: caseEvents.kind,
		payload: caseEvents.payload,
		clientEventId: caseEvents.clientEventId
	})
	.from(caseEvents)
	.where(eq(caseEvents.caseId, sql.placeholder('caseId')))
	.orderBy(asc(caseEvents.seq))
	.limit(MAX_EVENTS_PER_CASE)
	.prepare();

export type StoredTimelineEvent = TimelineEvent & { clientEventId: string };

/** The events that make the case's state, in server order (no rankings: they are not needed). */
export function readTimeline(caseId: string): Promise<StoredTimelineEvent[]> {
	return findTimeline.all({ caseId });
}

export type NewEvent = {
	shopId: string;
	caseId: string;
	seq: number;
	clientEventId: string;
	kind: EventKind;
	payload: Record<string, unknown>;
	ranking: RankingEntry[];
	editionId: string;
	actorUserId: string | null;
	apiKeyId: string | null;
	createdAt: Date;
};

export const eventInsert = (event: NewEvent) =>
	db.insert(caseEvents).values({ id: generateId(), ...event });

/** SQLite's answer when a unique index refuses a row (here: a sequence number or event id taken). */
export function isUniqueViolation(error: unknown): boolean {
	for (let e = error, depth = 0; e && depth < 5; depth++) {
		if (e instanceof Error && /UNIQUE constraint failed/.test(e.message)) return true;
		e = e instanceof Error ? e.cause : undefined;
	}
	return false;
}

/** Probabilities kept with each event: four decimals, as the API shows them. */
export const toRanking = (causes: { key: string; probability: number }[]): RankingEntry[] =>
	causes.map(({ key, probability }) => ({ key, probability }));

export const TOP_CAUSES_ON_CASE = 3;
