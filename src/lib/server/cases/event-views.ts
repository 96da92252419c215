// Events as the API shows them: who, when, what, and the ranking after each.
import { and, asc, eq, gt } from 'drizzle-orm';
import type { CaseEventView } from '../../api/cases-schema';
import { db } from '../db';
import { caseEvents, rulebookEditions, users } from '../db/schema';
import { caseNotFound, MAX_EVENTS_PER_CASE, readCase, type Actor } from './store';

const eventViewColumns = {
	id: caseEvents.clientEventId,
	seq: caseEvents.seq,
	kind: caseEvents.kind,
	payload: caseEvents.payload,
	ranking: caseEvents.ranking,
	edition: rulebookEditions.number,
	byId: users.id,
	byName: users.name,
	createdAt: caseEvents.createdAt
};

type EventViewRow = { byId: string | null; byName: string | null; createdAt: Date } & Omit<
	CaseEventView,
	'by' | 'at'
>;

const toView = ({ byId, byName, createdAt, ...event }: EventViewRow): CaseEventView => ({
	...event,
	by: byId ? { id: byId, name: byName ?? '' } : null,
	at: createdAt.toISOString()
});

/** The case's events after `afterSeq`, in server order, as the API shows them. */
export async function readEventViews(caseId: string, afterSeq = 0): Promise<CaseEventView[]> {
	const rows = await db
		.select(eventViewColumns)
		.from(caseEvents)
		.innerJoin(rulebookEditions, eq(rulebookEditions.id, caseEvents.editionId))
		.leftJoin(users, eq(users.id, caseEvents.actorUserId))
		.where(and(eq(caseEvents.caseId, caseId), gt(caseEvents.seq, afterSeq)))
		.orderBy(asc(caseEvents.seq))
		.limit(MAX_EVENTS_PER_CASE);
	return rows.map(toView);
}

/** GET …/events?after=: what a second device polls to follow the case. */
export async function listEventsAfter(actor: Actor, caseId: string, afterSeq: number) {
	const row = await readCase(actor, caseId);
	if (!row) throw caseNotFound();
	const events = row.lastSeq > afterSeq ? await readEventViews(row.id, afterSeq) : [];
	return { events, lastSeq: row.lastSeq, status: row.status };
}

export async function readEventView(caseId: string, clientEventId: string) {
	const [row] = await db
		.select(eventViewColumns)
		.from(caseEvents)
		.innerJoin(rulebookEditions, eq(rulebookEditions.id, caseEvents.editionId))
		.leftJoin(users, eq(users.id, caseEvents.actorUserId))
		.where(and(eq(caseEvents.caseId, caseId), eq(caseEvents.clientEventId, clientEventId)));
	return row ? toView(row) : undefined;
}
