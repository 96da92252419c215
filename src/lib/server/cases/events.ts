// The case timeline: appending one event (idempotent by its client id, ordered by the server,
// re-ranked with the case's edition) and reading events as the API shows them.
import { and, asc, desc, eq, gt, sql } from 'drizzle-orm';
import type { AppendEvent, CaseEventView } from '../../api/cases-schema';
import { deriveCaseState, settledKeys } from '../../cases/answers';
import { db } from '../db';
import { caseEvents, cases, rulebookEditions, users } from '../db/schema';
import { getCompiledEdition, publishedEditionsOf, type PublishedEdition } from '../editions';
import { AppError } from '../errors';
import { scoreCase } from './scoring';
import {
	eventInsert,
	isUniqueViolation,
	MAX_EVENTS_PER_CASE,
	readCase,
	readTimeline,
	TOP_CAUSES_ON_CASE,
	type Actor,
	type CaseRow
} from './store';
import { checkEvent } from './validate-event';

/** Two devices appending to one case at the same moment: the loser re-reads and tries again. */
const MAX_APPEND_ATTEMPTS = 8;

export const caseNotFound = () => new AppError('not_found', 'There is no such case in this shop.');

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

async function readEventView(caseId: string, clientEventId: string) {
	const [row] = await db
		.select(eventViewColumns)
		.from(caseEvents)
		.innerJoin(rulebookEditions, eq(rulebookEditions.id, caseEvents.editionId))
		.leftJoin(users, eq(users.id, caseEvents.actorUserId))
		.where(and(eq(caseEvents.caseId, caseId), eq(caseEvents.clientEventId, clientEventId)));
	return row ? toView(row) : undefined;
}

/** For `rescored`: the shop's newest published edition, which must be the one asked for. */
async function rescoreTarget(row: CaseRow, toEdition: number): Promise<PublishedEdition> {
	const [newest] = await db
		.select({
			id: rulebookEditions.id,
			number: rulebookEditions.number,
			publishedAt: rulebookEditions.publishedAt
		})
		.from(rulebookEditions)
		.where(publishedEditionsOf(sql`${row.shopId}`))
		.orderBy(desc(rulebookEditions.number))
		.limit(1);
	if (!newest || newest.number !== toEdition) {
		throw new AppError(
			'conflict',
			`Edition ${toEdition} is not the shop's newest published edition (${newest?.number ?? 'none'}).`
		);
	}
	if (newest.id === row.editionId) {
		throw new AppError('conflict', `The case is already scored with edition ${toEdition}.`);
	}
	return getCompiledEdition(row.shopId, newest);
}

type AppendResult = {
	event: CaseEventView;
	replayed: boolean;
	diagnosis: Awaited<ReturnType<typeof scoreCase>>['diagnosis'];
};

/** The current diagnosis of a case, for a replayed append (nothing is written). */
async function answerReplay(row: CaseRow, event: CaseEventView): Promise<AppendResult> {
	const edition = await getCompiledEdition(row.shopId, {
		id: row.editionId,
		number: row.editionNumber,
		publishedAt: row.editionPublishedAt
	});
	const state = deriveCaseState(await readTimeline(row.id));
	const { diagnosis } = await scoreCase(edition, state, { testSteps: false });
	return { event, replayed: true, diagnosis };
}

/**
 * Appends one event to an open case of the caller's shop and answers it with the new diagnosis.
 * A client event id seen before is answered with the stored event and nothing is written.
 */
export async function appendEvent(
	actor: Actor,
	caseId: string,
	input: AppendEvent,
	now: () => Date = () => new Date()
): Promise<AppendResult> {
	for (let attempt = 0; attempt < MAX_APPEND_ATTEMPTS; attempt++) {
		const row = await readCase(actor, caseId);
		if (!row) throw caseNotFound();
		const timeline = await readTimeline(caseId);
		if (timeline.some((event) => event.clientEventId === input.id)) {
			return answerReplay(row, (await readEventView(caseId, input.id))!);
		}
		if (row.status !== 'open') {
			throw new AppError('conflict', `The case is ${row.status}; only an open case takes events.`);
		}
		if (timeline.length >= MAX_EVENTS_PER_CASE) {
			throw new AppError('conflict', `The case holds its limit of ${MAX_EVENTS_PER_CASE} events.`);
		}
		const written = await tryAppend(actor, row, timeline, input, now());
		if (written) return written;
	}
	throw new AppError('conflict', 'The case is changing too fast just now; send the event again.');
}

async function tryAppend(
	actor: Actor,
	row: CaseRow,
	timeline: Awaited<ReturnType<typeof readTimeline>>,
	input: AppendEvent,
	at: Date
): Promise<AppendResult | null> {
	const edition =
		input.kind === 'rescored'
			? await rescoreTarget(row, input.payload.toEdition)
			: await getCompiledEdition(row.shopId, {
					id: row.editionId,
					number: row.editionNumber,
					publishedAt: row.editionPublishedAt
				});
	const checked = checkEvent(input, {
		rulebook: edition.rulebook,
		complaintMatches: () =>
			row.complaint ? edition.diagnoser.matchComplaint(row.complaint, new Set()) : []
	});
	if (checked.issues.length) {
		throw new AppError('invalid_request', 'The event does not fit this case’s rulebook.', {
			issues: checked.issues
		});
	}
	const payload =
		input.kind === 'rescored'
			? { fromEdition: row.editionNumber, toEdition: edition.number }
			: checked.payload;
	const seq = row.lastSeq + 1;
	const state = deriveCaseState([...timeline, { seq, kind: input.kind, payload }]);
	const { diagnosis, ranking } = await scoreCase(edition, state, { testSteps: false });
	try {
		await db.batch([
			eventInsert({
				shopId: row.shopId,
				caseId: row.id,
				seq,
				clientEventId: input.id,
				kind: input.kind,
				payload,
				ranking,
				editionId: edition.id,
				actorUserId: actor.userId,
				apiKeyId: actor.apiKeyId,
				createdAt: at
			}),
			db
				.update(cases)
				.set({
					lastSeq: seq,
					topCauses: ranking.slice(0, TOP_CAUSES_ON_CASE),
					editionId: edition.id,
					updatedAt: at
				})
				.where(and(eq(cases.id, row.id), eq(cases.lastSeq, row.lastSeq)))
		]);
	} catch (error) {
		// Another device took this sequence number (or sent this id) first: read again.
		if (isUniqueViolation(error)) return null;
		throw error;
	}
	const event: CaseEventView = {
		id: input.id,
		seq,
		kind: input.kind,
		payload,
		ranking,
		edition: edition.number,
		by: actor.userId ? { id: actor.userId, name: row.actorName ?? '' } : null,
		at: at.toISOString()
	};
	return { event, replayed: false, diagnosis };
}

/** Suggestions from the complaint that the technician has not yet accepted or rejected. */
export function pendingSuggestions(
	edition: PublishedEdition,
	complaint: string | null,
	state: ReturnType<typeof deriveCaseState>
) {
	return complaint ? edition.diagnoser.matchComplaint(complaint, settledKeys(state)) : [];
}
